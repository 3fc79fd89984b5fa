/**
 * overask as a library: every operation the CLI offers, the layers' pure functions, and the model types.
 * Operations that touch files come from src/ops; everything else is pure (bytes, text or data in).
 */
// Reading manifests
export { readManifestBytes, readManifestSource, detectKind, openArchive, openArchiveBytes, type ReadOptions, type DetectedKind, type ArchiveReader, type ArchiveEntryInfo, type RandomAccessSource } from "./extract/index.js";
export { readManifestFile, openArchiveFile } from "./ops/read-manifest.js";
export { decodeBinaryXml } from "./extract/binary/binary-xml.js";
export { ResourceTable } from "./extract/binary/resource-table.js";
export { parsePlainXml } from "./extract/plain-xml.js";
export { decodeProtoXml } from "./extract/proto/proto-xml.js";
export { readDex, looksLikeDex, javaName, type DexFile, type DexClass, type DexMethodRef, type DexFieldRef } from "./extract/dex/dex.js";
export { readDexEntries, DEX_ENTRY, type DexInput } from "./extract/code.js";
export { codeEvidence, codeStatusText, evidenceLabel, blindSpotText, packageGroup, BLIND_SPOTS, type CodeEvidence, type PermissionEvidence, type EvidenceItem, type CodeStatus, type BlindSpot, type ComponentUse } from "./score/code-evidence.js";
export { apiPermissionMap, type ApiPermissionMap, type MapEntry } from "./platform/api-map.js";
export { buildManifest, qualifyClassName } from "./extract/manifest/build.js";
export * from "./extract/manifest/model.js";
export type { XmlDocument, XmlElement, XmlAttribute } from "./extract/xml-tree.js";

// Platform facts
export { platformPermission, platformPermissions, normalizePermissionName, PLATFORM_TABLE_VERSION, type PlatformPermission } from "./platform/permissions.js";
export { protectionFromInt, protectionFromText } from "./platform/protection.js";
export { isSensitive, isDangerous, storeAppCanHold } from "./platform/sensitivity.js";

// Corpora and baselines
export { openCorpus, detectCorpusFormat, type Corpus, type CorpusOptions, type CorpusRecord, type CorpusReport, type CorpusSource } from "./baseline/corpus/index.js";
export { openCorpusFile, corpusFile, type CorpusFileOptions } from "./ops/corpus.js";
export { learn, type LearnOptions, type LearnResult } from "./baseline/learn.js";
export { learnFiles, foldFiles, type LearnFilesOptions } from "./ops/learn.js";
export { parseBaselineFile, serializeBaseline, foldBaselines, baselineOf, type BaselineFile } from "./baseline/baseline-file.js";
export { readBaselineFile, writeBaselineFile, loadJudge, defaultBaselinePath, type LoadedJudge } from "./ops/baseline.js";

// Judging
export { Judge, type CheckResult, type JudgeOptions } from "./score/judge.js";
export { CHECKS, checkById, checkIdsTagged } from "./score/registry.js";
export type { Check, CheckMeta, CheckTag, Finding, Level } from "./score/types.js";
export { chooseCategory, resolveCategory, parseCategoryIndex, type CategoryChoice } from "./score/category.js";
export { scoreRecord, type RecordScore } from "./score/records.js";
export { compareVersions, type Delta } from "./score/delta.js";
export { planTrim, snippetFor, type TrimPlan, type TrimCandidate } from "./score/trim/plan.js";
export { patchManifest } from "./score/trim/patch.js";
export { parseMergeReport, type PermissionOrigin } from "./score/merge-report.js";
export { rowOf, failedRow, type AppRow } from "./score/row.js";
export { heatmapData, type Heatmap } from "./score/heatmap.js";

// Operations on files (what the CLI's commands call)
export { facts } from "./ops/facts.js";
export { checkFiles, checkRecords, readCategoryIndex, type CheckOutcome, type RecordsOutcome } from "./ops/check.js";
export { gatesOf, tripsGate, type Gates } from "./score/gates.js";
export { trim, type TrimOptions, type TrimOutcome } from "./ops/trim.js";
export { delta } from "./ops/delta.js";
export { sweep, listInputs, parseShard, shardOf, scoreInput, readRows, type SweepOptions, type SweepSummary, type SweepInput } from "./ops/sweep/index.js";
export { writeFileAtomic } from "./ops/files.js";

// Formatters
export { factsToJson, factsToText, type FactsResult } from "./report/facts.js";
export { checkToJson, checkToText, type CheckRun } from "./report/check.js";
export { checkToSarif } from "./report/sarif.js";
export { trimToJson, trimToText, deltaToJson, deltaToText } from "./report/trim-delta.js";
export { sweepToHtml } from "./report/html/sweep-report.js";
export { sweepSummaryText } from "./report/sweep-summary.js";
export { rowToCsv, csvHeader } from "./report/csv.js";
export { baselineSummary } from "./report/learn.js";

export * from "./errors.js";
export { LIMITS } from "./limits.js";
export { TOOL_VERSION } from "./version.js";
export { run as runCli } from "./cli/main.js";
