/**
 * The baseline file: JSON with a schema version, holding counts (so that baselines merge exactly),
 * the parameters that turn counts into rates, provenance, and the risk model with its evaluation.
 * Parsing and serializing only: the ops layer reads and writes the file (atomically).
 */
import { BaselineError } from "../errors.js";
import { PLATFORM_TABLE_VERSION } from "../platform/permissions.js";
import { TOOL_VERSION } from "../version.js";
import { CountTable, type SerializedCounts } from "./counts.js";
import type { AtypicalityTable } from "./atypicality.js";
import { corpusEra, type BaselineEra } from "./era.js";
import type { RiskModel } from "./model.js";
import { Baseline, type RateParameters } from "./rates.js";

export const BASELINE_FORMAT = "overask-baseline";
/** 2: the per-permission bounded model, atypicality distributions, validation results. */
export const BASELINE_SCHEMA_VERSION = 2;

export interface InputProvenance {
  path: string;
  role: "frequencies" | "labels" | "frequencies+labels" | "validation";
  format: string;
  licence?: string;
  rows: number;
  accepted: number;
  rejected: number;
  duplicateIds: number;
  labeled: number;
  positives: number;
}

export interface StoredModel extends RiskModel {
  /** The labeled corpus the model learned from, named in every risk statement. */
  corpus: string;
  corpusLicence?: string;
  /** The labeled corpus's full citation (provenance only; statements use `corpus`). */
  corpusCitation?: string;
  /** `category`: training rows' terms against their category; `pooled`: the labeled corpus had no categories. Scoring always uses the app's category. */
  featureBasis: "category" | "pooled";
  /** Present when the model was trained on a seeded stratified sample of the labeled rows. */
  sample?: { of: number; taken: number; seed: number };
}

export interface BaselineFile {
  format: typeof BASELINE_FORMAT;
  schemaVersion: typeof BASELINE_SCHEMA_VERSION;
  createdAt: string;
  tool: { name: "overask"; version: string };
  platformTable: string;
  parameters: RateParameters & { aliases: Record<string, string> };
  provenance: { inputs: InputProvenance[]; notes: string[] };
  counts: SerializedCounts;
  /** The newest platform level the corpus speaks for (absent in files written before it was kept: computed on load). */
  era?: BaselineEra;
  /** Summed-surprisal percentiles of the baseline's own apps, per category: the atypicality scale. */
  atypicality?: AtypicalityTable;
  model: StoredModel | null;
  caution: string;
}

export function cautionFor(corpus: string | undefined): string {
  return corpus
    ? `Risk figures are statistical associations with the apps flagged in ${corpus}, learned from that corpus; they are not evidence of intent or harm. Store and platform policy decide.`
    : "This baseline has no risk model: it gives category frequencies only.";
}

export function newBaselineFile(parts: Omit<BaselineFile, "format" | "schemaVersion" | "createdAt" | "tool" | "platformTable" | "caution">, createdAt = new Date()): BaselineFile {
  return {
    format: BASELINE_FORMAT,
    schemaVersion: BASELINE_SCHEMA_VERSION,
    createdAt: createdAt.toISOString(),
    tool: { name: "overask", version: TOOL_VERSION },
    platformTable: PLATFORM_TABLE_VERSION,
    ...parts,
    caution: cautionFor(parts.model?.corpus),
  };
}

/** Parses and checks the text of a baseline file; `path` names it in errors. */
export function parseBaselineFile(text: string, path: string): BaselineFile {
  let json: Partial<BaselineFile>;
  try {
    json = JSON.parse(text);
  } catch {
    throw new BaselineError("is not JSON (damaged, or not a baseline file)", { file: path });
  }
  if (json?.format !== BASELINE_FORMAT) throw new BaselineError("is not an overask baseline file", { file: path });
  if (json.schemaVersion !== BASELINE_SCHEMA_VERSION) {
    throw new BaselineError(`has schema version ${json.schemaVersion}; this overask (${TOOL_VERSION}) reads version ${BASELINE_SCHEMA_VERSION}: relearn it with this version`, { file: path });
  }
  if (!json.counts?.pooled || typeof json.counts.pooled.apps !== "number" || !json.parameters) throw new BaselineError("lacks counts or parameters", { file: path });
  return json as BaselineFile;
}

/** The rates view of a baseline file. */
export function baselineOf(file: BaselineFile): Baseline {
  const { aliases, ...parameters } = file.parameters;
  const counts = CountTable.fromJSON(file.counts);
  return new Baseline(counts, parameters, new Map(Object.entries(aliases ?? {})), file.era?.api ?? corpusEra(counts).api);
}

/** Serializes a baseline file the same way every time (stable key order from the writers). */
export function serializeBaseline(file: BaselineFile): string {
  return `${JSON.stringify(file, null, 1)}\n`;
}

/**
 * Folds baselines: the counts add up exactly, as if learned on all corpora at once. Rate parameters
 * must agree. Risk models cannot be merged (their features depend on the counts), so the result has none.
 */
export function foldBaselines(files: { path: string; file: BaselineFile }[], createdAt = new Date()): BaselineFile {
  if (files.length === 0) throw new BaselineError("nothing to fold");
  const first = files[0];
  const table = CountTable.fromJSON(first.file.counts);
  for (const { path, file } of files.slice(1)) {
    if (JSON.stringify(file.parameters) !== JSON.stringify(first.file.parameters)) {
      throw new BaselineError(`its parameters differ from ${first.path}'s; learn both with the same --prior, --min-support, --confidence, --uncommon-below and --alias`, { file: path });
    }
    table.merge(CountTable.fromJSON(file.counts));
  }
  const notes = files.flatMap((f) => f.file.provenance.notes);
  if (files.some((f) => f.file.model)) notes.push("folded from baselines with risk models; models do not merge, so this baseline has none (learn one on the combined corpora)");
  return newBaselineFile(
    {
      parameters: first.file.parameters,
      provenance: { inputs: files.flatMap((f) => f.file.provenance.inputs), notes },
      counts: table.toJSON(),
      era: corpusEra(table, [...new Set(files.map((f) => f.file.era?.years).filter((y): y is string => !!y))].join(", ") || undefined),
      model: null,
    },
    createdAt,
  );
}
