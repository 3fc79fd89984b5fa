/** `overask trim` and `overask delta`. */
import { readFileSync } from "node:fs";
import { writeFileAtomic } from "../baseline/baseline-file.js";
import { InputError } from "../errors.js";
import { readManifestFile } from "../extract/index.js";
import { requestedPermissionNames } from "../extract/manifest/model.js";
import { pickStyle } from "../report/style.js";
import { deltaToJson, deltaToText, trimToJson, trimToText } from "../report/trim-delta.js";
import { compareVersions } from "../score/delta.js";
import { readMergeReport } from "../score/merge-report.js";
import { planTrim } from "../score/trim/plan.js";
import { patchManifest } from "../score/trim/patch.js";
import { judgeOptions, loadJudge } from "./check-command.js";
import { EXIT } from "./exit-codes.js";
import { UsageError } from "./learn-command.js";
import type { Io } from "./main.js";

type Opts = Record<string, string | string[] | boolean | undefined>;

export async function trimCommand(file: string, o: Opts, io: Io): Promise<number> {
  if (o.inPlace && o.write) throw new UsageError("give either --write FILE or --in-place, not both");
  const { judge } = loadJudge(o);
  const manifest = readManifestFile(file);
  const result = judge.judge(manifest, judgeOptions(o));
  const origins = o.mergeReport ? readMergeReport(o.mergeReport as string) : undefined;
  const scorer = judge.scorer;
  const category = result.category.category;
  const sourcePath = (o.source as string | undefined) ?? (manifest.input.kind === "plain-xml" ? file : undefined);
  const source = sourcePath === file ? manifest : sourcePath ? readManifestFile(sourcePath) : undefined;
  if (source && source.input.kind !== "plain-xml") throw new UsageError(`--source must be a plain source manifest; ${sourcePath} is not`);
  const plan = planTrim(result, {
    ...(origins ? { origins } : {}),
    ...(source ? { source } : {}),
    ...(scorer ? { riskWithout: (perms: string[]) => scorer.probability(category, perms) } : {}),
  });
  const keep = new Set(((o.keep as string[] | undefined) ?? []).map((k) => (k.includes(".") ? k : `android.permission.${k}`)));
  const chosen = plan.candidates.filter((c) => !keep.has(c.permission));

  const target = o.inPlace ? sourcePath : (o.write as string | undefined);
  if (o.write || o.inPlace) {
    if (!sourcePath || !target) throw new UsageError(`--write and --in-place patch a plain source manifest; ${file} is ${manifest.input.kind === "apk" ? "an APK" : "a binary manifest"}: name the source with --source`);
    const patched = patchManifest(readFileSync(sourcePath, "utf8"), plan, chosen);
    writeFileAtomic(target, patched);
    // The patched file must still read as a manifest, and without the permissions removed.
    const check = readManifestFile(target);
    const left = new Set(requestedPermissionNames(check));
    const stillThere = chosen.filter((c) => c.action.kind === "delete" && c.element && left.has(c.permission));
    if (stillThere.length) throw new InputError(`patched manifest still requests ${stillThere.map((c) => c.permission).join(", ")}`, { file: target });
  }
  const caution = scorer ? judge.file.caution : undefined;
  io.stdout.write(o.format === "json" ? trimToJson({ ...plan, candidates: chosen }, file) : trimToText({ ...plan, candidates: chosen }, file, caution, pickStyle(io.stdout, io.env)));
  if (target) io.stderr.write(`overask: wrote ${target} (${chosen.length} change${chosen.length === 1 ? "" : "s"})\n`);
  return EXIT.OK;
}

export async function deltaCommand(before: string, after: string, o: Opts, io: Io): Promise<number> {
  const { judge } = loadJudge(o);
  const options = judgeOptions(o);
  const newer = judge.judge(readManifestFile(after), options);
  // Judge the old version against the new one's category, so that the two are comparable.
  const older = judge.judge(readManifestFile(before), { ...options, ...(newer.category.category ? { category: newer.category.category } : {}) });
  const d = compareVersions(older, newer);
  const caution = judge.scorer ? judge.file.caution : undefined;
  io.stdout.write(o.format === "json" ? deltaToJson(d, [before, after], caution) : deltaToText(d, [before, after], caution, pickStyle(io.stdout, io.env)));
  return EXIT.OK;
}
