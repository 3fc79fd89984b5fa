/**
 * The baseline file: JSON with a schema version, holding counts (so that baselines merge exactly),
 * the parameters that turn counts into rates, provenance, and the risk model with its evaluation.
 * Parsing and serializing only: the ops layer reads and writes the file (atomically).
 */
import { BaselineError } from "../errors.js";
import { PLATFORM_TABLE_VERSION } from "../platform/permissions.js";
import { TOOL_VERSION } from "../version.js";
import { compareText } from "../util/compare.js";
import { hash52 } from "../util/hash.js";
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
 *
 * - Categories are matched without regard to case, as everywhere else (`Tools` and `TOOLS` are one); the
 *   folded category keeps the spelling of the part with more apps, and a note says so.
 * - The folded era is the older of the parts' eras: a permission added after it was not there to be
 *   requested by the older part's apps, so their counts must not dilute its rate (docs/baselines.md).
 * - The same counts given twice (the same baseline, or two learned on the same corpus) are refused: folding
 *   them would count every app twice.
 */
export function foldBaselines(files: { path: string; file: BaselineFile }[], createdAt = new Date()): BaselineFile {
  if (files.length === 0) throw new BaselineError("nothing to fold");
  const first = files[0];
  for (const { path, file } of files.slice(1)) {
    if (JSON.stringify(file.parameters) !== JSON.stringify(first.file.parameters)) {
      const differ = Object.keys({ ...first.file.parameters, ...file.parameters }).filter((k) => JSON.stringify((file.parameters as unknown as Record<string, unknown>)[k]) !== JSON.stringify((first.file.parameters as unknown as Record<string, unknown>)[k]));
      throw new BaselineError(`its rate parameters differ from ${first.path}'s (${differ.join(", ")}); baselines fold only when learned with the same ones`, { file: path, code: "fold-parameters-differ" });
    }
  }
  const seen = new Map<number, string>();
  for (const { path, file } of files) {
    const fingerprint = hash52(JSON.stringify(file.counts));
    const earlier = seen.get(fingerprint);
    if (earlier !== undefined) throw new BaselineError(`holds the same counts as ${earlier} (the same baseline, or one learned on the same corpus): folding them would count every app twice`, { file: path, code: "fold-same-baseline" });
    seen.set(fingerprint, path);
  }
  const { spelling, merged } = categorySpellings(files.map((f) => f.file.counts));
  const table = new CountTable();
  for (const { file } of files) table.merge(CountTable.fromJSON(respell(file.counts, spelling)));
  const notes = files.flatMap((f) => f.file.provenance.notes);
  for (const [kept, names] of merged) notes.push(`categories ${names.join(", ")} folded as one, ${kept} (categories are matched without regard to case; the spelling of the part with more apps is kept)`);
  const eras = files.map((f) => f.file.era?.api ?? corpusEra(CountTable.fromJSON(f.file.counts)).api);
  const oldest = Math.min(...eras);
  if (new Set(eras).size > 1) notes.push(`the parts' eras differ (API ${[...new Set(eras)].sort((a, b) => a - b).join(", ")}): the folded baseline speaks for the older, API ${oldest}, so that apps that could not request a newer permission do not dilute its rate`);
  if (files.some((f) => f.file.model)) notes.push("folded from baselines with risk models; models do not merge, so this baseline has none (learn one on the combined corpora)");
  return newBaselineFile(
    {
      parameters: first.file.parameters,
      provenance: { inputs: files.flatMap((f) => f.file.provenance.inputs), notes },
      counts: table.toJSON(),
      era: foldedEra(table, oldest, [...new Set(files.map((f) => f.file.era?.years).filter((y): y is string => !!y))].join(", ") || undefined),
      model: null,
    },
    createdAt,
  );
}

/** The folded era: the merged corpus's own era, held at the oldest part's level. */
function foldedEra(table: CountTable, oldest: number, years?: string): BaselineEra {
  const own = corpusEra(table, years);
  return own.api <= oldest ? own : { api: oldest, ...(years ? { years } : {}) };
}

/**
 * One spelling a category across the parts (case ignored): the spelling of the part with the most apps
 * in it. `merged` lists the spellings that were told apart only by case, under the one kept.
 */
function categorySpellings(parts: readonly SerializedCounts[]): { spelling: Map<string, string>; merged: Map<string, string[]> } {
  const byLower = new Map<string, { name: string; apps: number }[]>();
  for (const c of parts) {
    for (const [name, g] of Object.entries(c.categories)) {
      const list = byLower.get(name.toLowerCase()) ?? [];
      const same = list.find((x) => x.name === name);
      if (same) same.apps += g.apps;
      else list.push({ name, apps: g.apps });
      byLower.set(name.toLowerCase(), list);
    }
  }
  const spelling = new Map<string, string>();
  const merged = new Map<string, string[]>();
  for (const list of byLower.values()) {
    const kept = [...list].sort((a, b) => b.apps - a.apps || compareText(a.name, b.name))[0].name;
    for (const x of list) spelling.set(x.name, kept);
    if (list.length > 1) merged.set(kept, list.map((x) => x.name).sort(compareText));
  }
  return { spelling, merged };
}

function respell(c: SerializedCounts, spelling: Map<string, string>): SerializedCounts {
  const categories: SerializedCounts["categories"] = {};
  for (const [name, g] of Object.entries(c.categories)) {
    const to = spelling.get(name) ?? name;
    const had = categories[to];
    if (!had) categories[to] = g;
    else {
      // Two spellings within one part: add them up.
      const permissions = { ...had.permissions };
      for (const [p, k] of Object.entries(g.permissions)) permissions[p] = (permissions[p] ?? 0) + k;
      categories[to] = { apps: had.apps + g.apps, permissions };
    }
  }
  return { ...c, categories };
}
