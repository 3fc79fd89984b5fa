/**
 * `learn`: counts category frequencies from one or more corpora, trains the risk model on a labeled
 * corpus (the same corpora, or a separate one), and assembles the baseline file.
 */
import { CorpusError } from "../errors.js";
import { seededRandom } from "../util/random.js";
import { newBaselineFile, type BaselineFile, type InputProvenance, type StoredModel } from "./baseline-file.js";
import { CountTable } from "./counts.js";
import { corpusEra } from "./era.js";
import { openCorpus, type CorpusOptions, type CorpusRecord, type CorpusReport, type CorpusSource } from "./corpus/index.js";
import { isDangerous } from "../platform/sensitivity.js";
import { atypicalityTable } from "./atypicality.js";
import { appTerms } from "./features.js";
import { trainRiskModel, validateModel, type TrainingRow } from "./model.js";
import { Baseline, DEFAULT_RATE_PARAMETERS, type Exclusion, type RateParameters } from "./rates.js";

export interface LearnOptions {
  /** Corpora for category frequencies (rows need a category). */
  frequencies: { source: CorpusSource; options: CorpusOptions; licence?: string }[];
  /** A separate labeled corpus for the risk model; without it, labels in the frequency corpora are used. */
  labels?: { source: CorpusSource; options: CorpusOptions; licence?: string };
  /** How risk statements name the labeled corpus (default: its path). */
  labelsName?: string;
  /** The labeled corpus's full citation, kept in the model's provenance (not in risk statements). */
  labelsCitation?: string;
  /** Labeled corpora the model never saw, scored after training and recorded in the baseline. */
  validate?: { source: CorpusSource; options: CorpusOptions; name?: string; licence?: string }[];
  /** When the frequency corpus's apps were collected (e.g. "2020"), recorded with the era. */
  corpusYears?: string;
  parameters?: Partial<RateParameters>;
  aliases?: Map<string, string>;
  /** The run fails when a corpus rejects more than this share of its rows. */
  rejectLimit?: number;
  model?: { seed?: number; folds?: number; maxRows?: number };
  createdAt?: Date;
  /** Progress of reading, per corpus. */
  onProgress?: (source: string, done: number, total: number) => void;
  onReject?: (source: string, line: number, reason: string) => void;
}

export interface LearnResult {
  file: BaselineFile;
  reports: CorpusReport[];
  /** Why no model was trained, when none was. */
  noModel?: string;
}

/** Labeled rows above this are sampled (seeded, stratified); below it, every row trains the model. */
export const DEFAULT_MAX_TRAINING_ROWS = 200_000;
/** Apps of the frequency corpora kept (seeded reservoir) for the atypicality percentiles. */
export const ATYPICALITY_SAMPLE = 100_000;

/** A uniform, seeded reservoir sample of at most `capacity` items. */
class Reservoir<T> {
  readonly items: T[] = [];
  seen = 0;
  private readonly rand;
  constructor(private readonly capacity: number, seed: number) {
    this.rand = seededRandom(seed ^ 0xa7);
  }
  offer(item: T): void {
    this.seen++;
    if (this.items.length < this.capacity) this.items.push(item);
    else {
      const j = Math.floor(this.rand() * this.seen);
      if (j < this.capacity) this.items[j] = item;
    }
  }
}

/** A labeled corpus without a column list: the permissions requested by at least this many labeled rows get a weight. */
export const VOCABULARY_MIN_ROWS = 5;

function vocabularyOf(records: readonly CorpusRecord[]): string[] {
  const n = new Map<string, number>();
  for (const r of records) for (const p of r.permissions) n.set(p, (n.get(p) ?? 0) + 1);
  return [...n].filter(([, k]) => k >= VOCABULARY_MIN_ROWS).map(([p]) => p).sort();
}

/** A labeled record as the model sees it: vocabulary indicators, category terms, reference scores. */
function trainingRow(baseline: Baseline, vocabulary: readonly string[], record: CorpusRecord, exclude?: Exclusion): TrainingRow {
  const index = new Map(vocabulary.map((p, j) => [p, j]));
  const terms = appTerms(baseline, record.category, record.permissions, exclude);
  return {
    label: record.label!,
    indicators: record.permissions.map((p) => index.get(p)).filter((j): j is number => j !== undefined),
    terms,
    references: { dangerousCount: record.permissions.filter(isDangerous).length, permissionCount: record.permissions.length, surprisal: appTerms(baseline, undefined, record.permissions, exclude)[2] },
  };
}
export const DEFAULT_REJECT_LIMIT = 0.05;

/** Keeps a uniform, seeded sample of up to `capacity` records per label (reservoir sampling). */
class LabeledSample {
  readonly seen = [0, 0];
  readonly kept: { record: CorpusRecord; inBaseline: boolean }[][] = [[], []];
  private readonly rand;
  constructor(private readonly capacity: number, seed: number) {
    this.rand = seededRandom(seed ^ 0x5eed);
  }
  offer(record: CorpusRecord, inBaseline: boolean): void {
    const l = record.label!;
    const seen = ++this.seen[l];
    if (this.kept[l].length < this.capacity) this.kept[l].push({ record, inBaseline });
    else {
      const j = Math.floor(this.rand() * seen);
      if (j < this.capacity) this.kept[l][j] = { record, inBaseline };
    }
  }
  /** The stratified sample: each label in proportion to how often it was seen, `capacity` rows at most. */
  rows(): { rows: { record: CorpusRecord; inBaseline: boolean }[]; of: number } {
    const total = this.seen[0] + this.seen[1];
    if (total <= this.capacity) return { rows: [...this.kept[0], ...this.kept[1]], of: total };
    const take = [0, 1].map((l) => Math.round((this.capacity * this.seen[l]) / total));
    return { rows: [...this.kept[0].slice(0, take[0]), ...this.kept[1].slice(0, take[1])], of: total };
  }
}

async function drain(source: CorpusSource, options: CorpusOptions, each: (r: CorpusRecord) => void, hooks: Pick<LearnOptions, "onProgress" | "onReject">, rejectLimit: number): Promise<CorpusReport> {
  const path = source.name;
  const corpus = openCorpus(source, {
    ...options,
    onProgress: hooks.onProgress ? (d, t) => hooks.onProgress!(path, d, t) : undefined,
    onReject: hooks.onReject ? (r) => hooks.onReject!(path, r.line, r.reason) : undefined,
  });
  for await (const r of corpus.records) each(r);
  const rep = corpus.report;
  if (rep.rows === 0) throw new CorpusError("holds no rows", { file: path });
  const share = rep.rejected / rep.rows;
  if (share > rejectLimit) {
    const first = rep.rejects[0];
    throw new CorpusError(
      `${rep.rejected} of ${rep.rows} rows rejected (${(100 * share).toFixed(1)}%), over the limit of ${(100 * rejectLimit).toFixed(1)}%` +
        (first ? `; first at line ${first.line}: ${first.reason}` : ""),
      { file: path, code: "reject-limit" },
    );
  }
  return rep;
}

export async function learn(options: LearnOptions): Promise<LearnResult> {
  const parameters: RateParameters = { ...DEFAULT_RATE_PARAMETERS, ...options.parameters };
  const rejectLimit = options.rejectLimit ?? DEFAULT_REJECT_LIMIT;
  const seed = options.model?.seed ?? 1;
  const sample = new LabeledSample(options.model?.maxRows ?? DEFAULT_MAX_TRAINING_ROWS, seed);
  const counts = new CountTable();
  const frequencyApps = new Reservoir<{ category?: string; permissions: string[] }>(ATYPICALITY_SAMPLE, seed);
  const reports: CorpusReport[] = [];
  const inputs: InputProvenance[] = [];
  const useFrequencyLabels = !options.labels;
  const aliases = options.aliases ?? new Map<string, string>();

  for (const f of options.frequencies) {
    const rep = await drain(
      f.source,
      { ...f.options, aliases, requireCategory: true },
      (r) => {
        counts.add(r);
        frequencyApps.offer({ ...(r.category !== undefined ? { category: r.category } : {}), permissions: r.permissions });
        if (useFrequencyLabels && r.label !== undefined) sample.offer(r, true);
      },
      options,
      rejectLimit,
    );
    reports.push(rep);
    inputs.push(provenance(rep, useFrequencyLabels && rep.labeled > 0 ? "frequencies+labels" : "frequencies", f.licence));
  }
  if (counts.pooled.apps === 0) throw new CorpusError("no app with a category was read; nothing to learn from");

  let labelReport: CorpusReport | undefined;
  let labelLicence: string | undefined;
  if (options.labels) {
    const l = options.labels;
    labelReport = await drain(l.source, { ...l.options, aliases, requireCategory: false }, (r) => {
      if (r.label !== undefined) sample.offer(r, false);
    }, options, rejectLimit);
    reports.push(labelReport);
    inputs.push(provenance(labelReport, "labels", l.licence));
    labelLicence = l.licence;
  } else {
    labelReport = reports.find((r) => r.labeled > 0);
    labelLicence = options.frequencies.find((f) => f.source.name === labelReport?.source)?.licence;
  }

  // The era rule applies in training as in judging: terms of permissions newer than the corpus use the same rule.
  const era = corpusEra(counts, options.corpusYears);
  const baseline = new Baseline(counts, parameters, new Map(), era.api);
  const { model, noModel } = await learnModel(baseline, sample, { labelReport, labelLicence, aliases, reports, inputs, rejectLimit, seed }, options);
  const atypicality = atypicalityTable(baseline, frequencyApps.items);
  const notes = learnNotes(reports, baseline, parameters, frequencyApps, model, noModel);

  const file = newBaselineFile(
    {
      parameters: { ...parameters, aliases: Object.fromEntries([...aliases].sort()) },
      provenance: { inputs, notes },
      counts: counts.toJSON(),
      era,
      atypicality,
      model,
    },
    options.createdAt,
  );
  return { file, reports, ...(noModel ? { noModel } : {}) };
}

/** What learning the model needs from the corpora read before it. */
interface ModelInputs {
  labelReport?: CorpusReport;
  labelLicence?: string;
  aliases: Map<string, string>;
  reports: CorpusReport[];
  inputs: InputProvenance[];
  rejectLimit: number;
  seed: number;
}

/** The risk model from the labeled rows, validated on each `--validate` corpus; none without labeled rows. */
async function learnModel(baseline: Baseline, sample: LabeledSample, m: ModelInputs, options: LearnOptions): Promise<{ model: StoredModel | null; noModel?: string }> {
  const { labelReport, labelLicence, aliases, reports, inputs, rejectLimit, seed } = m;
  const { rows: picked, of } = sample.rows();
  const positives = picked.filter((p) => p.record.label === 1).length;
  if (picked.length === 0) return { model: null, noModel: "no labeled rows: the baseline has frequencies only" };
  if (positives === 0 || positives === picked.length) {
    throw new CorpusError(`the labeled rows are all ${positives ? "flagged" : "unflagged"}: no risk model can be learned`, { file: labelReport?.source ?? "the labeled corpus", code: "labels-one-class" });
  }
  {
    const vocabulary = labelReport?.vocabulary ?? vocabularyOf(picked.map((p) => p.record));
    const hasCategories = picked.some((p) => p.record.category !== undefined);
    // Cross-fitting: a row that is also in the frequency counts is scored against counts without it.
    const rows = picked.map(({ record, inBaseline }) =>
      trainingRow(baseline, vocabulary, record, inBaseline ? { ...(record.category !== undefined ? { category: record.category } : {}), permissions: new Set(record.permissions) } : undefined),
    );
    const trained = trainRiskModel(rows, { vocabulary, seed, folds: options.model?.folds ?? 5 });
    for (const v of options.validate ?? []) {
      const name = v.name ?? v.source.name;
      const vrows: TrainingRow[] = [];
      const rep = await drain(v.source, { ...v.options, aliases, requireCategory: false }, (r) => {
        if (r.label !== undefined) vrows.push(trainingRow(baseline, vocabulary, r));
      }, options, rejectLimit);
      reports.push(rep);
      inputs.push(provenance(rep, "validation", v.licence));
      const recorded = rep.vocabulary ? new Set(rep.vocabulary) : new Set(vrows.flatMap((r) => r.indicators.map((j) => vocabulary[j])));
      const overlap = vocabulary.filter((p) => recorded.has(p)).length / vocabulary.length;
      if (overlap === 0) throw new CorpusError("records none of the labeled corpus's permissions: the model cannot be validated on it (are the permission columns named as the platform names them?)", { file: v.source.name });
      const pos = vrows.filter((r) => r.label === 1).length;
      if (pos === 0 || pos === vrows.length) throw new CorpusError(`its labeled rows are all ${pos ? "flagged" : "unflagged"}: no ROC AUC can be computed`, { file: v.source.name, code: "validation-labels-one-class" });
      trained.validation.push(validateModel(trained, vrows, name, overlap));
    }
    const model: StoredModel = {
      ...trained,
      corpus: options.labelsName ?? labelReport?.source ?? "the labeled corpus",
      ...(labelLicence ? { corpusLicence: labelLicence } : {}),
      ...(options.labelsCitation ? { corpusCitation: options.labelsCitation } : {}),
      featureBasis: hasCategories ? "category" : "pooled",
      ...(of > picked.length ? { sample: { of, taken: picked.length, seed } } : {}),
    };
    return { model };
  }
}

/** The provenance notes: each corpus's own, then what a reader of the baseline should know of it. */
function learnNotes(reports: CorpusReport[], baseline: Baseline, parameters: RateParameters, frequencyApps: Reservoir<unknown>, model: StoredModel | null, noModel: string | undefined): string[] {
  const notes: string[] = reports.flatMap((r) => r.notes.map((n) => `${r.source}: ${n}`));
  if (noModel) notes.push(noModel);
  if (model?.sample) notes.push(`the model was trained on a seeded stratified sample of ${model.sample.taken} of ${model.sample.of} labeled rows`);
  if (model && !model.training.converged) notes.push(`the model's fit did not fully converge (KKT residual ${model.training.kktResidual.toExponential(2)} after ${model.training.iterations} iterations)`);
  if (frequencyApps.seen > frequencyApps.items.length) notes.push(`atypicality percentiles come from a seeded sample of ${frequencyApps.items.length} of ${frequencyApps.seen} apps`);
  for (const c of baseline.categorySummary()) if (c.pooled) notes.push(`category ${c.name} has ${c.apps} apps, below the minimum support of ${parameters.minSupport}: it uses the pooled baseline`);

  return notes;
}

function provenance(rep: CorpusReport, role: InputProvenance["role"], licence?: string): InputProvenance {
  return {
    path: rep.source,
    role,
    format: rep.format,
    ...(licence ? { licence } : {}),
    rows: rep.rows,
    accepted: rep.accepted,
    rejected: rep.rejected,
    duplicateIds: rep.duplicateIds,
    labeled: rep.labeled,
    positives: rep.positives,
  };
}
