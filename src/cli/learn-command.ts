/** `overask learn` and `overask fold`: options in, an operation called, a summary out. */
import { foldFiles, learnFiles } from "../ops/learn.js";
import type { CorpusFileOptions } from "../ops/corpus.js";
import { baselineSummary } from "../report/learn.js";
import { pickStyle } from "../report/style.js";
import { EXIT } from "./exit-codes.js";
import type { Io } from "./io.js";
import { progressBar } from "./progress.js";

export interface LearnCliOptions {
  output: string;
  format?: "jsonl" | "wide-csv" | "files";
  idField?: string;
  categoryField?: string;
  permissionsField?: string;
  labelField?: string;
  labelColumn?: string;
  positive?: string[];
  columnsFrom?: string;
  columnsKind?: string;
  licence?: string;
  labels?: string;
  labelsLicence?: string;
  labelsName?: string;
  labelsCitation?: string;
  corpusYears?: string;
  alias?: [string, string][];
  prior: "fixed" | "empirical-bayes";
  priorStrength: number;
  confidence: number;
  minSupport: number;
  uncommonBelow: number;
  seed: number;
  folds: number;
  maxTrainRows: number;
  rejectLimit: number;
  rejects?: string;
  validate?: string[];
  validateName?: string[];
  validateLabelField?: string;
  validatePositive?: string[];
  validateLicence?: string;
}

/** The corpus-reading options, the same for every corpus of a run. */
export function corpusOptions(o: Partial<LearnCliOptions>): CorpusFileOptions {
  const c: CorpusFileOptions = {};
  if (o.format) c.format = o.format;
  if (o.idField) c.idField = o.idField;
  if (o.categoryField) c.categoryField = o.categoryField;
  if (o.permissionsField) c.permissionsField = o.permissionsField;
  if (o.labelField ?? o.labelColumn) c.labelField = (o.labelField ?? o.labelColumn)!;
  if (o.positive) c.positive = o.positive;
  if (o.columnsFrom) c.columnsFrom = o.columnsFrom;
  if (o.columnsKind) c.columnsKind = o.columnsKind;
  return c;
}

export async function learnCommand(corpora: string[], o: LearnCliOptions, io: Io): Promise<number> {
  const options = corpusOptions(o);
  const progress = progressBar(io.stderr);
  try {
    const result = await learnFiles({
      frequencies: corpora.map((path) => ({ path, options, ...(o.licence ? { licence: o.licence } : {}) })),
      ...(o.labels ? { labels: { path: o.labels, options, ...(o.labelsLicence ? { licence: o.labelsLicence } : {}) } } : {}),
      ...(o.labelsName ? { labelsName: o.labelsName } : {}),
      ...(o.labelsCitation ? { labelsCitation: o.labelsCitation } : {}),
      ...(o.corpusYears ? { corpusYears: o.corpusYears } : {}),
      parameters: {
        prior: { method: o.prior, strength: o.priorStrength },
        confidence: o.confidence,
        minSupport: o.minSupport,
        uncommonBelow: o.uncommonBelow,
      },
      aliases: new Map(o.alias ?? []),
      rejectLimit: o.rejectLimit,
      model: { seed: o.seed, folds: o.folds, maxRows: o.maxTrainRows },
      onProgress: (source, done, total) => progress.update(source, done, total),
      ...(o.rejects ? { rejects: o.rejects } : {}),
      ...(o.validate?.length
        ? {
            validate: o.validate.map((path, i) => ({
              path,
              // Validation corpora keep only the columns that name platform permissions (they rarely share a column list).
              options: { ...options, ...(o.validateLabelField ? { labelField: o.validateLabelField } : {}), ...(o.validatePositive ? { positive: o.validatePositive } : {}), columnsFrom: undefined, columnsKind: undefined, idField: undefined, platformColumnsOnly: true },
              ...(o.validateName?.[i] ? { name: o.validateName[i] } : {}),
              ...(o.validateLicence ? { licence: o.validateLicence } : {}),
            })),
          }
        : {}),
      output: o.output,
    });
    progress.stop();
    io.stdout.write(baselineSummary(result.file, o.output, pickStyle(io.stdout, io.env)));
    return EXIT.OK;
  } finally {
    progress.stop();
  }
}

export function foldCommand(files: string[], output: string, io: Io): number {
  const { folded, inputs } = foldFiles(files, output);
  io.stdout.write(`Folded ${files.length} baselines into ${output}: ${folded.counts.pooled.apps} apps in ${Object.keys(folded.counts.categories).length} categories.\n`);
  for (const n of folded.provenance.notes.slice(-1)) if (folded.model === null && inputs.some((i) => i.file.model)) io.stderr.write(`overask: note: ${n}\n`);
  return EXIT.OK;
}
