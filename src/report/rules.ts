/** The rules of policies, listed for `overask rules`. */
import type { Policy, PolicyRule } from "../score/policy/policy.js";
import { TOOL_VERSION } from "../version.js";
import { PLAIN, wrap, type Style } from "./style.js";
import { pct, short } from "./format.js";


function what(r: PolicyRule): string {
  const where = [r.categories ? `only in ${r.categories.join(", ")}` : "", r.exceptCategories ? `except in ${r.exceptCategories.join(", ")}` : "", r.when ? `when the app declares ${declares(r.when)}` : "", r.unless ? `unless the app declares ${declares(r.unless)}` : ""].filter(Boolean).join("; ");
  const kind = r.forbid
    ? `forbids ${r.forbid.map(short).join(" + ")}`
    : r.riskAbove !== undefined
      ? `caps the risk at ${pct(r.riskAbove)}`
      : r.atypicalityAbove !== undefined
        ? `caps the atypicality at the ${r.atypicalityAbove}th percentile`
        : r.limitBelow
          ? `needs ${short(r.limitBelow.permission)} limited by android:maxSdkVersion ≤ ${r.limitBelow.maxSdkVersion}`
          : `needs a written justification for ${r.justify!.map(short).join(", ")}`;
  return where ? `${kind}; ${where}` : kind;
}

function declares(d: NonNullable<PolicyRule["when"]>): string {
  return [d.kind ?? "a component", d.action ? `handling ${d.action}` : "", d.permission ? `guarded by ${short(d.permission)}` : ""].filter(Boolean).join(" ");
}

export function rulesToText(policies: readonly Policy[], bundled: boolean, s: Style = PLAIN): string {
  const out: string[] = [];
  if (bundled) out.push(...wrap("No --policy given: these are the bundled policies, in force only when passed with --policy to check, sweep, trim or delta.", 80, 0).map((l) => s.dim(l)), "");
  for (const p of policies) {
    out.push(s.bold(`${p.name} (${p.rules.length} rules)`), `  ${p.file}`);
    if (p.source) out.push(...wrap(`  ${p.source}`, 80, 2).map((l) => s.dim(l)));
    for (const r of p.rules) {
      out.push(`  ${r.id}  (${r.level}; line ${r.line})`);
      out.push(...wrap(`    ${what(r)}`, 80, 6));
      out.push(...wrap(`    ${r.message}`, 80, 4));
      out.push(...wrap(`    source: ${r.source}`, 80, 6).map((l) => s.dim(l)));
    }
    out.push("");
  }
  return `${out.join("\n")}`;
}

export function rulesToJson(policies: readonly Policy[], bundled: boolean): string {
  return `${JSON.stringify({ tool: "overask", version: TOOL_VERSION, bundled, policies: policies.map((p) => ({ ...p, rules: p.rules.map((r) => ({ ...r, summary: what(r) })) })) }, null, 2)}\n`;
}
