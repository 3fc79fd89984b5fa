/**
 * overask as a library: the same operations the CLI offers.
 */
export { readManifestBytes, readManifestFile, detectKind } from "./extract/index.js";
export { decodeBinaryXml } from "./extract/binary/binary-xml.js";
export { ResourceTable } from "./extract/binary/resource-table.js";
export { parsePlainXml } from "./extract/plain-xml.js";
export { openArchiveBytes, openArchiveFile, type ArchiveReader, type ArchiveEntryInfo } from "./extract/containers/zip.js";
export { buildManifest, qualifyClassName } from "./extract/manifest/build.js";
export * from "./extract/manifest/model.js";
export type { XmlDocument, XmlElement, XmlAttribute } from "./extract/xml-tree.js";
export { platformPermission, platformPermissions, normalizePermissionName, PLATFORM_TABLE_VERSION } from "./platform/permissions.js";
export { protectionFromInt, protectionFromText } from "./platform/protection.js";
export { factsToJson, factsToText, type FactsResult } from "./report/facts.js";
export * from "./errors.js";
export { LIMITS } from "./limits.js";
export { TOOL_VERSION } from "./version.js";
export { run as runCli } from "./cli/main.js";
export { openCorpus, type CorpusOptions, type CorpusRecord, type CorpusReport } from "./baseline/corpus/index.js";
export { learn, type LearnOptions } from "./baseline/learn.js";
export { readBaselineFile, foldBaselines, baselineOf, type BaselineFile } from "./baseline/baseline-file.js";
export { Judge, type CheckResult, type JudgeOptions } from "./score/judge.js";
export { CHECKS } from "./score/registry.js";
export { sweep, type SweepOptions, type SweepSummary } from "./ops/sweep/index.js";
