/** `learn` and `fold` on files: corpora read from disk, baselines written atomically. */
import { appendFileSync, writeFileSync } from "node:fs";
import { foldBaselines, type BaselineFile } from "../baseline/baseline-file.js";
import { learn, type LearnOptions, type LearnResult } from "../baseline/learn.js";
import { OutputError } from "../errors.js";
import { csvCell } from "../util/csv.js";
import { readBaselineFile, writeBaselineFile } from "./baseline.js";
import { corpusFile, corpusReaderOptions, type CorpusFileOptions } from "./corpus.js";

export interface LearnFilesOptions extends Omit<LearnOptions, "frequencies" | "labels" | "validate" | "onReject"> {
  /** Corpus files for category frequencies, with how to read them. */
  frequencies: { path: string; options: CorpusFileOptions; licence?: string }[];
  /** A separate labeled corpus file for the risk model. */
  labels?: { path: string; options: CorpusFileOptions; licence?: string };
  /** Labeled corpus files the model never sees in training, scored after it. */
  validate?: { path: string; options: CorpusFileOptions; name?: string; licence?: string }[];
  /** Write every rejected row (file, line, reason) to this CSV file. */
  rejects?: string;
  /** Write the baseline here (atomically); without it, nothing is written. */
  output?: string;
}

/** Learns a baseline from corpus files. */
export async function learnFiles(o: LearnFilesOptions): Promise<LearnResult> {
  const { frequencies, labels, validate, rejects, output, ...rest } = o;
  if (rejects) {
    try {
      writeFileSync(rejects, "file,line,reason\n");
    } catch (e) {
      throw new OutputError(`cannot be written (${(e as Error).message})`, { file: rejects });
    }
  }
  const source = (c: { path: string; options: CorpusFileOptions; licence?: string }) => ({
    source: corpusFile(c.path),
    options: corpusReaderOptions(c.options),
    ...(c.licence ? { licence: c.licence } : {}),
  });
  const result = await learn({
    ...rest,
    frequencies: frequencies.map(source),
    ...(labels ? { labels: source(labels) } : {}),
    ...(validate ? { validate: validate.map((v) => ({ ...source(v), ...(v.name ? { name: v.name } : {}) })) } : {}),
    ...(rejects ? { onReject: (file: string, line: number, reason: string) => appendFileSync(rejects, `${csvCell(file)},${line},${csvCell(reason)}\n`) } : {}),
  });
  if (output) writeBaselineFile(output, result.file);
  return result;
}

/** Folds baseline files into one, written to `output`. */
export function foldFiles(files: readonly string[], output: string): { folded: BaselineFile; inputs: { path: string; file: BaselineFile }[] } {
  const inputs = files.map((path) => ({ path, file: readBaselineFile(path) }));
  const folded = foldBaselines(inputs);
  writeBaselineFile(output, folded);
  return { folded, inputs };
}
