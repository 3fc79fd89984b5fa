/**
 * Policies: a reviewer's own rules, as data (docs/policies.md, schema in docs/policy.schema.json). Parsing
 * checks the file against the schema (ajv) and every platform permission name against the platform table,
 * and reports the first problem as one line with the file, the rule and its line. Evaluating a policy
 * against a judged app gives findings that carry the rule, the file and the line.
 */
import { createRequire } from "node:module";
import type { ErrorObject, ValidateFunction } from "ajv";
import type { Component, Manifest } from "../../extract/manifest/model.js";
import { requestedPermissionNames } from "../../extract/manifest/model.js";
import { nearestPlatformPermission, normalizePermissionName, platformPermission } from "../../platform/permissions.js";
import { UsageError } from "../../errors.js";
import type { Baseline } from "../../baseline/rates.js";
import { nearestCategory, resolveCategory } from "../category.js";
import type { Finding, Level } from "../types.js";
import { POLICY_SCHEMA } from "./generated/schema.js";

export interface Declares {
  action?: string;
  permission?: string;
  kind?: Component["kind"];
}

export interface PolicyRule {
  id: string;
  level: Level;
  message: string;
  source: string;
  categories?: string[];
  exceptCategories?: string[];
  when?: Declares;
  unless?: Declares;
  forbid?: string[];
  riskAbove?: number;
  atypicalityAbove?: number;
  limitBelow?: { permission: string; maxSdkVersion: number };
  justify?: string[];
  /** Where the rule is: the policy file and the line its id is on. */
  file: string;
  line: number;
}

export interface Policy {
  name: string;
  source?: string;
  file: string;
  rules: PolicyRule[];
}

/** A policy file that cannot be used: one line, `file:line: rule id: problem`. A usage error (exit 2). */
export class PolicyError extends UsageError {
  override name = "PolicyError";
}

let validator: ValidateFunction | undefined;

function validate(json: unknown): ErrorObject[] {
  if (!validator) {
    // ajv is CommonJS; loaded when a policy is first read.
    const Ajv = (createRequire(import.meta.url)("ajv") as { default: new (o: object) => { compile(s: object): ValidateFunction } }).default;
    validator = new Ajv({ allErrors: true, strict: true, strictRequired: false }).compile(POLICY_SCHEMA as object);
  }
  return validator(json) ? [] : (validator.errors ?? []);
}

/** The line (1-based) of a rule's `"id": "<id>"` in the text, or of the rule list when not found. */
function lineOf(text: string, id: string | undefined): number {
  const at = id === undefined ? -1 : text.search(new RegExp(`"id"\\s*:\\s*"${id.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}"`));
  const pos = at >= 0 ? at : Math.max(0, text.indexOf('"rules"'));
  return text.slice(0, pos).split("\n").length;
}

/**
 * Permission names of a rule, normalized; a platform-looking name the platform does not define is an
 * error, added to `errors` (every error of a file is reported at once).
 */
function checkPermission(name: string, where: string, errors: string[]): string {
  const full = normalizePermissionName(name);
  const platformLike = full.startsWith("android.permission.") || !full.includes(".");
  if (platformLike && !platformPermission(full.includes(".") ? full : `android.permission.${full}`)) {
    const near = nearestPlatformPermission(full.includes(".") ? full : `android.permission.${full}`);
    errors.push(`${where}: "${name}" is not a platform permission${near.distance <= 3 ? `; did you mean ${near.name}?` : ""}`);
  }
  return full.includes(".") ? full : `android.permission.${full}`;
}

/** One schema error in words, where it is. */
function schemaMessage(e: ErrorObject, json: { rules?: unknown[] }, text: string, file: string): string {
  const index = /^\/rules\/(\d+)/.exec(e.instancePath)?.[1];
  const rule = index !== undefined ? (json.rules?.[Number(index)] as { id?: string } | undefined) : undefined;
  const where = `${file}:${lineOf(text, rule?.id)}${rule?.id ? `: rule ${rule.id}` : ""}`;
  const kinds = ["forbid", "riskAbove", "atypicalityAbove", "limitBelow", "justify"];
  const missingKind = e.keyword === "required" && kinds.includes((e.params as { missingProperty: string }).missingProperty);
  const field = e.instancePath.replace(/^\/rules\/\d+\/?/, "") || "the rule";
  const what =
    e.keyword === "oneOf" || missingKind
      ? "a rule needs exactly one of forbid, riskAbove, atypicalityAbove, limitBelow, justify"
      : e.keyword === "additionalProperties"
        ? `unknown key "${(e.params as { additionalProperty: string }).additionalProperty}"`
        : e.keyword === "enum"
          ? `${field} must be one of ${((e.params as { allowedValues: unknown[] }).allowedValues ?? []).map((v) => JSON.stringify(v)).join(", ")}`
          : `${field} ${e.message}`;
  return `${where}: ${what}`;
}

/** Parses and checks a policy file's text; `file` names it in errors and findings. */
export function parsePolicy(text: string, file: string): Policy {
  let json: { policy: string; source?: string; rules: Omit<PolicyRule, "file" | "line">[] };
  try {
    json = JSON.parse(text);
  } catch (e) {
    const m = /position (\d+)/.exec((e as Error).message);
    const line = m ? text.slice(0, Number(m[1])).split("\n").length : 1;
    throw new PolicyError(`${file}:${line}: not valid JSON (${(e as Error).message.replace(/^.*?: /, "")})`);
  }
  const schemaErrors = validate(json);
  if (schemaErrors.length) {
    // Every error at once (a oneOf error brings its branches' errors along: the oneOf line says it all).
    const oneOfAt = new Set(schemaErrors.filter((e) => e.keyword === "oneOf").map((e) => e.instancePath));
    const shownErrors = schemaErrors.filter((e) => e.keyword === "oneOf" || ![...oneOfAt].some((p) => e.instancePath.startsWith(p)));
    throw new PolicyError([...new Set(shownErrors.map((e) => schemaMessage(e, json, text, file)))].join("\n"));
  }
  const errors: string[] = [];
  const seen = new Set<string>();
  const rules = json.rules.map((r) => {
    const line = lineOf(text, r.id);
    const where = `${file}:${line}: rule ${r.id}`;
    if (seen.has(r.id)) errors.push(`${where}: the id is used twice`);
    seen.add(r.id);
    const rule: PolicyRule = { ...r, file, line };
    if (r.forbid) rule.forbid = r.forbid.map((p) => checkPermission(p, where, errors));
    if (r.justify) rule.justify = r.justify.map((p) => checkPermission(p, where, errors));
    if (r.limitBelow) rule.limitBelow = { ...r.limitBelow, permission: checkPermission(r.limitBelow.permission, where, errors) };
    for (const d of [r.when, r.unless]) if (d?.permission) d.permission = checkPermission(d.permission, where, errors);
    return rule;
  });
  if (errors.length) throw new PolicyError(errors.join("\n"));
  return { name: json.policy, ...(json.source ? { source: json.source } : {}), file, rules };
}

/** The finding id of a policy rule, so that rules of different policies never clash with checks. */
export function policyCheckId(rule: Pick<PolicyRule, "id">): string {
  return `policy:${rule.id}`;
}

function declares(m: Manifest, d: Declares): boolean {
  return m.components.some(
    (c) =>
      (d.kind === undefined || c.kind === d.kind) &&
      (d.permission === undefined || c.permission === d.permission) &&
      (d.action === undefined || c.intentFilters.some((f) => f.actions.includes(d.action!))),
  );
}

/** What a policy rule needs of a judgement. */
export interface PolicySubject {
  manifest: Manifest;
  category?: string;
  risk?: number;
  atypicality?: number;
}

/** The findings of one policy on one app. Messages are the rule's own; data keeps the rule's place. */
export function evaluatePolicy(policy: Policy, s: PolicySubject): Finding[] {
  const m = s.manifest;
  const requested = new Set(requestedPermissionNames(m));
  const out: Finding[] = [];
  const cat = s.category?.toLowerCase();
  for (const r of policy.rules) {
    if (r.categories && !(cat !== undefined && r.categories.some((c) => c.toLowerCase() === cat))) continue;
    if (r.exceptCategories && cat !== undefined && r.exceptCategories.some((c) => c.toLowerCase() === cat)) continue;
    if (r.when && !declares(m, r.when)) continue;
    if (r.unless && declares(m, r.unless)) continue;
    const data = { message: r.message, source: r.source, policy: policy.name, file: r.file, line: r.line, rule: r.id };
    const at = (p: string) => m.usesPermissions.find((u) => u.name === p)?.source ?? { path: "/manifest" };
    const push = (subject: string, extra: Record<string, string | number | boolean | string[]> = {}) =>
      out.push({ checkId: policyCheckId(r), level: r.level, subject, location: requested.has(subject) ? at(subject) : { path: "/manifest" }, data: { ...data, ...extra } });
    if (r.forbid && r.forbid.every((p) => requested.has(p))) {
      // One finding a permission of the combination, so that trim can offer each for removal.
      for (const p of r.forbid) push(p, { combination: r.forbid, removable: true });
    } else if (r.riskAbove !== undefined && s.risk !== undefined && s.risk > r.riskAbove) push(m.package, { risk: s.risk, cap: r.riskAbove });
    else if (r.atypicalityAbove !== undefined && s.atypicality !== undefined && s.atypicality > r.atypicalityAbove) push(m.package, { atypicality: s.atypicality, cap: r.atypicalityAbove });
    else if (r.limitBelow) {
      const u = m.usesPermissions.find((p) => p.name === r.limitBelow!.permission && !p.removedByTools);
      if (u && (u.maxSdkVersion === undefined || u.maxSdkVersion > r.limitBelow.maxSdkVersion)) push(u.name, { maxSdkVersion: r.limitBelow.maxSdkVersion });
    } else if (r.justify) {
      const guards = new Set(m.components.map((c) => c.permission).filter((g): g is string => g !== undefined));
      for (const p of r.justify) if (requested.has(p) || guards.has(p)) push(p, { justify: true });
    }
  }
  return out;
}

/**
 * The categories a policy's rules name that the baseline does not have (case and aliases aside), each an
 * error in words with the nearest category: a misspelt category would silently never fire, or never exempt.
 */
export function policyCategoryErrors(policy: Policy, baseline: Baseline): string[] {
  const errors: string[] = [];
  for (const r of policy.rules) {
    for (const [key, list] of [["categories", r.categories], ["exceptCategories", r.exceptCategories]] as const) {
      for (const c of list ?? []) {
        if (resolveCategory(baseline, c).fallback !== "unknown-category") continue;
        const near = nearestCategory(baseline, c);
        errors.push(`${r.file}:${r.line}: rule ${r.id}: ${key} names "${c}", which is not a category of the baseline${near ? `; did you mean "${near}"?` : ""}`);
      }
    }
  }
  return errors;
}
