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
import { appFeatures, FEATURE_NAMES } from "./features.js";
import { trainRiskModel, type TrainingRow } from "./model.js";
import { Baseline, DEFAULT_RATE_PARAMETERS, type RateParameters } from "./rates.js";

export interface LearnOptions {
  /** Corpora for category frequencies (rows need a category). */
  frequencies: { source: CorpusSource; options: CorpusOptions; licence?: string }[];
  /** A separate labeled corpus for the risk model; without it, labels in the frequency corpora are used. */
  labels?: { source: CorpusSource; options: CorpusOptions; licence?: string };
  /** How risk statements name the labeled corpus (default: its path). */
  labelsName?: string;
  /** The labeled corpus's full citation, kept in the model's provenance (not in risk statements). */
  labelsCitation?: string;
  /** When the frequency corpus's apps were collected (e.g. "2020"), recorded with the era. */
  corpusYears?: string;
  parameters?: Partial<RateParameters>;
  aliases?: Map<string, string>;
  /** The run fails when a corpus rejects more than this share of its rows. */
  rejectLimit?: number;
  model?: { seed?: number; folds?: number; steps?: number; maxSteps?: number; learningRate?: number; maxRows?: number };
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

export const DEFAULT_MAX_TRAINING_ROWS = 5_000;
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
        (first ? `; first at line ${first.line}: ${first.reason}` : "") +
        " (list them with --rejects FILE, or raise --reject-limit)",
      { file: path },
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

  // The era rule applies in training as in judging: features of permissions newer than the corpus use the same rule.
  const era = corpusEra(counts, options.corpusYears);
  const baseline = new Baseline(counts, parameters, new Map(), era.api);
  let model: StoredModel | null = null;
  let noModel: string | undefined;
  const { rows: picked, of } = sample.rows();
  const positives = picked.filter((p) => p.record.label === 1).length;
  if (picked.length === 0) noModel = "no labeled rows: the baseline has frequencies only";
  else if (positives === 0 || positives === picked.length) noModel = "the labeled rows are all of one label: no model can be learned";
  else {
    const vocabulary = labelReport?.vocabulary ? new Set(labelReport.vocabulary) : undefined;
    const hasCategories = picked.some((p) => p.record.category !== undefined);
    // Cross-fitting: a row that is also in the frequency counts is scored against counts without it.
    const surprisalAt = FEATURE_NAMES.indexOf("surprisal");
    const rows: TrainingRow[] = picked.map(({ record, inBaseline }) => {
      const counted = vocabulary ? record.permissions.filter((p) => vocabulary.has(p)) : record.permissions;
      const features = appFeatures(baseline, record.category, counted, {
        exclude: inBaseline ? { category: record.category, permissions: new Set(record.permissions) } : undefined,
      });
      return {
        label: record.label!,
        features,
        references: { dangerousCount: counted.filter(isDangerous).length, surprisal: features[surprisalAt] },
      };
    });
    const trained = trainRiskModel(rows, {
      featureNames: FEATURE_NAMES,
      seed,
      folds: options.model?.folds ?? 5,
      steps: options.model?.steps ?? 100,
      maxSteps: options.model?.maxSteps ?? 3200,
      ...(options.model?.learningRate !== undefined ? { learningRate: options.model.learningRate } : {}),
    });
    model = {
      ...trained,
      corpus: options.labelsName ?? labelReport?.source ?? "the labeled corpus",
      ...(labelLicence ? { corpusLicence: labelLicence } : {}),
      ...(options.labelsCitation ? { corpusCitation: options.labelsCitation } : {}),
      featureBasis: hasCategories ? "category" : "pooled",
      ...(vocabulary ? { vocabulary: [...vocabulary].sort() } : {}),
      ...(of > picked.length ? { sample: { of, taken: picked.length, seed } } : {}),
    };
  }
  const notes: string[] = reports.flatMap((r) => r.notes.map((n) => `${r.source}: ${n}`));
  if (noModel) notes.push(noModel);
  if (model?.sample) notes.push(`the model was trained on a seeded stratified sample of ${model.sample.taken} of ${model.sample.of} labeled rows`);
  for (const d of model?.dropped ?? []) notes.push(`feature ${d.feature} was dropped: its fitted coefficient was negative (${d.coefficient.toFixed(4)})`);
  if (model && !model.training.converged) notes.push(`the model's fit did not converge (largest gradient ${model.training.gradientMax.toExponential(2)}); raise --steps`);
  for (const c of baseline.categorySummary()) if (c.pooled) notes.push(`category ${c.name} has ${c.apps} apps, below --min-support ${parameters.minSupport}: it uses the pooled baseline`);

  const file = newBaselineFile(
    {
      parameters: { ...parameters, aliases: Object.fromEntries([...aliases].sort()) },
      provenance: { inputs, notes },
      counts: counts.toJSON(),
      era,
      model,
    },
    options.createdAt,
  );
  return { file, reports, ...(noModel ? { noModel } : {}) };
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
