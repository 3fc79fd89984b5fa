/**
 * `trim`: plans the removals for an app, and with `write` patches a copy of its plain source manifest,
 * then reads the patch back to make sure it is still a manifest without the permissions removed.
 */
import { InputError, UsageError } from "../errors.js";
import { requestedPermissionNames, type Manifest } from "../extract/manifest/model.js";
import type { Judge } from "../score/judge.js";
import { parseMergeReport } from "../score/merge-report.js";
import { patchManifest } from "../score/trim/patch.js";
import { planTrim, type TrimPlan } from "../score/trim/plan.js";
import { normalizePermissionName } from "../platform/permissions.js";
import { resolve } from "node:path";
import { judgeFile, type FileJudgeOptions } from "./check.js";
import { readTextFile, writeFileAtomic } from "./files.js";
import { readManifestFile } from "./read-manifest.js";

export interface TrimOptions {
  judge: FileJudgeOptions;
  /** The build's manifest-merger report, to name the library that adds each permission. */
  mergeReport?: string;
  /** The app's plain source manifest, when `file` is an APK or a merged manifest. */
  source?: string;
  /** Permissions to leave alone. */
  keep?: readonly string[];
  /** Write the patched source manifest here. */
  write?: string;
  /** Patch the source manifest itself. */
  inPlace?: boolean;
  /** Also remove candidates the app's code uses (`--remove-used`); without it they are left and listed. */
  removeUsed?: boolean;
}

export interface TrimOutcome {
  plan: TrimPlan;
  /** The file written, when one was. */
  written?: string;
  /** --in-place found nothing to change, and wrote nothing. */
  unchanged?: boolean;
  /** Candidates a patch left because the code uses them (without `removeUsed`). */
  heldBack?: string[];
}

export function trim(judge: Judge, file: string, o: TrimOptions): TrimOutcome {
  if (o.inPlace && o.write) throw new UsageError("give either --write FILE or --in-place, not both");
  const result = judgeFile(judge, file, o.judge);
  const manifest = result.manifest;
  const origins = o.mergeReport ? parseMergeReport(readTextFile(o.mergeReport)) : undefined;
  const scorer = judge.scorer;
  const category = result.category.category;
  const sourcePath = o.source ?? (manifest.input.kind === "plain-xml" ? file : undefined);
  const source: Manifest | undefined = sourcePath === file ? manifest : sourcePath ? readManifestFile(sourcePath) : undefined;
  if (source && source.input.kind !== "plain-xml") throw new UsageError(`--source must be a plain source manifest; ${sourcePath} is not`);
  const full = planTrim(result, {
    ...(origins ? { origins } : {}),
    ...(source ? { source } : {}),
    ...(scorer ? { riskWithout: (perms: string[]) => scorer.probability(category, perms) } : {}),
  });
  // A bare name is a platform permission's (`SEND_SMS`), also when the platform does not define it (a typo).
  const keep = new Set((o.keep ?? []).map((k) => normalizePermissionName(k)).map((k) => (k.includes(".") ? k : `android.permission.${k}`)));
  const plan = { ...full, candidates: full.candidates.filter((c) => !keep.has(c.permission)) };

  const target = o.inPlace ? sourcePath : o.write;
  if (!o.write && !o.inPlace) return { plan };
  if (!sourcePath || !target) throw new UsageError(`--write and --in-place patch a plain source manifest; ${file} is ${manifest.input.kind === "apk" ? "an APK" : "a binary manifest"}: name the source with --source`);
  if (o.write && resolve(o.write) === resolve(sourcePath)) throw new UsageError(`--write ${o.write} is the source manifest itself; to patch it in place say --in-place`);
  const original = readTextFile(sourcePath);
  // A permission the code uses is never removed unless asked for by name of the flag.
  const held = o.removeUsed ? [] : plan.candidates.filter((c) => c.code?.status === "used").map((c) => c.permission);
  const applied = plan.candidates.filter((c) => !held.includes(c.permission));
  const heldBack = held.length ? { heldBack: held } : {};
  const patched = patchManifest(original, full, applied);
  // Nothing to change: an in-place patch leaves the file alone (its time stamp included).
  if (o.inPlace && patched === original) return { plan, unchanged: true, ...heldBack };
  writeFileAtomic(target, patched);
  // The patched file must still read as a manifest, and without the permissions removed.
  const left = new Set(requestedPermissionNames(readManifestFile(target)));
  const stillThere = applied.filter((c) => c.action.kind === "delete" && c.element && left.has(c.permission));
  if (stillThere.length) throw new InputError(`patched manifest still requests ${stillThere.map((c) => c.permission).join(", ")}`, { file: target });
  return { plan, written: target, ...heldBack };
}
