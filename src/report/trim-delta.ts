/** Formatters for `overask trim` and `overask delta`. */
import { codeStatusText, evidenceLabel } from "../score/code-evidence.js";
import type { Delta, Regression } from "../score/delta.js";
import { snippetFor, type TrimPlan } from "../score/trim/plan.js";
import { TOOLS_NS } from "../extract/xml-tree.js";
import { TOOL_VERSION } from "../version.js";
import { messageOf } from "./check.js";
import { atypicalityText, codeLookup, neededText, wordFinding } from "./messages.js";
import type { SafeReason } from "../score/trim/plan.js";
import { findingLines, verdict } from "./finding-text.js";
import { PLAIN, wrap, type Style } from "./style.js";
import { pct, short } from "./format.js";


const SAFE_BECAUSE: Record<SafeReason, string> = {
  "older-devices-keep-it": "older devices keep it, and newer ones ignore it at this target",
  "ignored-at-target": "the platform ignores it at this target",
  "not-granted-to-store-apps": "a store app is not granted it",
  "nothing-without-foreground-location": "it grants nothing without foreground location",
  "no-such-permission": "the platform defines no such permission",
  "forbidden-by-policy": "a policy in force forbids it",
  "not-seen-in-code": "the code's entry points reach nothing the permission maps tie to it (not proof: reflection and native code are not seen)",
  "not-seen-in-code-some-hidden": "the code's entry points reach nothing the permission maps tie to it, but this app loads code at run time or reflects on names built at run time, which no map sees: check before removing",
  "nothing-in-manifest-needs-it": "no component, service type or declaration in the manifest needs it",
  "nothing-in-manifest-needs-it-code-unread": "no component, service type or declaration in the manifest needs it (check the code before removing)",
};

/** Why acting on a candidate is safe, in words. */
export function safeText(reasons: readonly SafeReason[]): string {
  return reasons.map((r) => SAFE_BECAUSE[r]).join("; ");
}

/** A trim reason in words: its check's message for the permission. */
function reasonText(permission: string, r: TrimPlan["candidates"][number]["reasons"][number]): string {
  return wordFinding({ checkId: r.checkId, subject: permission, data: r.data });
}

export function trimToText(plan: TrimPlan, file: string, caution: string | undefined, s: Style = PLAIN): string {
  const out: string[] = [];
  out.push(s.bold(`${plan.package}: ${plan.candidates.length} permission${plan.candidates.length === 1 ? "" : "s"} worth removing or limiting`));
  out.push(...wrap(`  ${file}`, 80, 2));
  if (plan.risk !== undefined) {
    out.push(...wrap(`  risk now ${pct(plan.risk)}${plan.riskWithoutAll !== undefined ? `; with every change below ${pct(plan.riskWithoutAll)}` : ""} (base rate ${pct(plan.baseRate ?? 0)} of the labeled corpus${plan.prevalence ? `; at a prevalence of ${pct(plan.prevalence.share)}: ${pct(plan.prevalence.probability)} now` : ""})`, 80, 4));
    if (plan.atypicality) out.push(`  atypicality: ${atypicalityText(plan.atypicality, "")}`);
    if (caution) out.push(...wrap(`  ${caution}`, 80, 2).map((l) => s.dim(l)));
  }
  plan.candidates.forEach((c, i) => {
    out.push("");
    const risk = plan.risk !== undefined && c.riskWithout !== undefined ? `  risk ${pct(plan.risk)} → ${pct(c.riskWithout)}` : "";
    out.push(`${String(i + 1).padStart(3)}. ${s.bold(short(c.permission))}${risk}`);
    for (const r of c.reasons) out.push(...wrap(`     ${verdict(r.level, r.checkId, s)} ${reasonText(c.permission, r)}`, 80, 7).map((l) => s.dim(l)));
    if (c.safe.length) out.push(...wrap(`     safe because ${safeText(c.safe)}`, 80, 7).map((l) => s.dim(l)));
    if (c.code?.status === "used") out.push(...wrap(`     code: ${codeStatusText("used", c.code.users)} — removing it breaks that code; --write leaves it unless --remove-used`, 80, 7).map((l) => s.warn(l)));
    else if (c.code) out.push(...wrap(`     code: ${codeStatusText(c.code.status)}`, 80, 7).map((l) => s.dim(l)));
    if (c.libraries?.length) out.push(...wrap(`     added by ${c.libraries.join(", ")}`, 80, 10));
    const how =
      c.action.kind === "limit"
        ? `     keep it for older devices only${c.element?.source.line ? ` (line ${c.element.source.line})` : ""}:`
        : c.action.kind === "merge-remove"
          ? `     a library adds it; drop it when manifests merge (needs xmlns:tools="${TOOLS_NS}"):`
          : c.element?.source.line
            ? `     delete line ${c.element.source.line}:`
            : "     delete it from your manifest; if a library adds it, use tools:node=\"remove\" instead:";
    out.push(...wrap(how, 80, 5));
    out.push(`       ${snippetFor(c)}`);
  });
  if (plan.kept.length) {
    out.push("", s.bold("Flagged, but kept"));
    for (const k of plan.kept) out.push(...wrap(`  ${short(k.permission)}: ${k.reasons.map(neededText).join("; ")}`, 80, 4));
  }
  if (plan.typos.length) {
    out.push("", s.bold("Fix, do not remove"));
    for (const t of plan.typos) out.push(...wrap(`  ${t.permission} → ${t.nearest} (a likely typo: the app does not get the permission it meant)`, 80, 4));
    out.push(...wrap("  --write leaves these names as they are: correcting one grants the app a permission it does not get today, a change only its developer can decide on; fix them by hand where the app needs them.", 80, 4).map((l) => s.dim(l)));
  }
  if (plan.candidates.length === 0 && plan.typos.length === 0) out.push("", "  nothing to trim: no requested permission is uncommon, ungrantable or without effect");
  return `${out.join("\n")}\n`;
}

export function trimToJson(plan: TrimPlan, file: string): string {
  return `${JSON.stringify({ tool: "overask", version: TOOL_VERSION, schemaVersion: 1, file, ...plan, kept: plan.kept.map((k) => ({ ...k, why: k.reasons.map(neededText).join("; ") })), candidates: plan.candidates.map((c) => ({ ...c, reasons: c.reasons.map((r) => ({ ...r, message: reasonText(c.permission, r) })), safe: safeText(c.safe), safeBecause: c.safe, snippet: snippetFor(c) })) }, null, 2)}\n`;
}

/** A regression of an update, in words. */
export function regressionText(r: Regression): string {
  switch (r.kind) {
    case "target-downgrade":
      return `targetSdk lowered from ${r.before} to ${r.after}: the platform applies the older, looser behaviour again (below 23, dangerous permissions are granted at install without a prompt)`;
    case "debuggable-on":
      return 'android:debuggable="true" in this version: a debugger can attach to it and run code with its permissions';
    case "cleartext-on":
      return "cleartext (unencrypted) network traffic turned on in this version";
  }
}

export function deltaToText(d: Delta, files: [string, string], caution: string | undefined, s: Style = PLAIN): string {
  const v = (x: Delta["before"]) => [x.versionName, x.versionCode !== undefined ? `(code ${x.versionCode})` : undefined].filter(Boolean).join(" ") || "no version";
  const out: string[] = [];
  out.push(s.bold(d.samePackage ? `${d.after.package}: ${v(d.before)} → ${v(d.after)}` : `${d.before.package} → ${d.after.package} (different packages)`));
  out.push(...wrap(`  ${files[0]} → ${files[1]}`, 80, 4));
  if (d.before.targetSdk !== d.after.targetSdk) out.push(`  targetSdk ${d.before.targetSdk ?? "—"} → ${d.after.targetSdk ?? "—"}${(d.after.targetSdk ?? 0) < (d.before.targetSdk ?? 0) ? s.warn("  (lower: see below)") : ""}`);
  if (d.before.risk !== undefined && d.after.risk !== undefined) {
    out.push(`  risk ${pct(d.before.risk)} (${d.before.band}) → ${pct(d.after.risk)} (${d.after.band}); base rate ${pct(d.after.baseRate ?? 0)} of the labeled corpus`);
    if (d.before.riskAtPrevalence !== undefined && d.after.riskAtPrevalence !== undefined) out.push(`  at your prevalence: ${pct(d.before.riskAtPrevalence)} → ${pct(d.after.riskAtPrevalence)}`);
    if (d.before.atypicality !== undefined && d.after.atypicality !== undefined) out.push(`  atypicality percentile ${Math.floor(d.before.atypicality)} → ${Math.floor(d.after.atypicality)}`);
    if (caution) out.push(...wrap(`  ${caution}`, 80, 2).map((l) => s.dim(l)));
  }
  if (d.regressions.length) {
    out.push("", s.bold(`Changes for the worse (${d.regressions.length})`));
    for (const r of d.regressions) out.push(...wrap(`  ${verdict(r.level, r.kind, s)} ${regressionText(r)}`, 80, 4));
  }
  out.push("", s.bold(`Permissions added (${d.added.length})`));
  const describe = (c: Delta["added"][number]) => [c.base, ...(c.flags ?? []), c.restricted ? `${c.restricted}-restricted` : undefined].filter(Boolean).join(", ");
  for (const a of d.added) out.push(`  + ${short(a.permission)}${describe(a) ? s.dim(`  ${describe(a)}`) : ""}`);
  out.push("", s.bold(`Permissions removed (${d.removed.length})`));
  for (const r of d.removed) out.push(`  - ${short(r.permission)}${describe(r) ? s.dim(`  ${describe(r)}`) : ""}`);
  out.push("", s.bold(`Newly uncommon for the category (${d.newlyUncommon.length})`));
  const code = codeLookup(d.codeNow);
  for (const f of d.newlyUncommon) out.push(...findingLines(f, wordFinding(f, code), [], s));
  if (d.newlyBroken.length) {
    out.push("", s.bold(`Policy rules newly broken (${d.newlyBroken.length})`));
    for (const f of d.newlyBroken) out.push(...findingLines(f, messageOf(f), [], s));
  }
  out.push("", s.bold(`Special access (${d.specialAccess.added.length} new, ${d.specialAccess.removed.length} gone)`));
  for (const f of d.specialAccess.added) out.push(...findingLines({ ...f, subject: `+ ${f.subject}` }, messageOf(f), [], s));
  for (const f of d.specialAccess.removed) out.push(...wrap(`  - ${f.subject}`, 80, 6));
  out.push("", s.bold(`Newly exported components (${d.newlyExported.length})`));
  for (const c of d.newlyExported) out.push(`  + ${c.kind} ${c.name}`);
  if (d.code) {
    const c = d.code;
    out.push("", s.bold(`Code evidence (${c.appeared.length} appeared, ${c.vanished.length} vanished)`));
    const line = (sign: string, e: (typeof c.appeared)[number]) => wrap(`  ${sign} ${evidenceLabel(e)} — ${e.permissions.map(short).join(" or ")}${e.packages.length ? ` (${e.packages.join(", ")})` : ""}${e.reached ? "" : ", never reached"}`, 80, 6);
    for (const e of c.appeared) out.push(...line("+", e));
    for (const e of c.vanished) out.push(...line("-", e));
    for (const p of c.statusChanged) out.push(...wrap(`  ${short(p.permission)}: ${p.before} → ${p.after}`, 80, 6));
  }
  return `${out.join("\n")}\n`;
}

export function deltaToJson(d: Delta, files: [string, string], caution: string | undefined): string {
  return `${JSON.stringify({ tool: "overask", version: TOOL_VERSION, schemaVersion: 1, files, caution, ...d, newlyUncommon: d.newlyUncommon.map((f) => ({ ...f, message: wordFinding(f, codeLookup(d.codeNow)) })), newlyBroken: d.newlyBroken.map((f) => ({ ...f, message: messageOf(f) })), regressions: d.regressions.map((r) => ({ ...r, message: regressionText(r) })) }, null, 2)}\n`;
}
