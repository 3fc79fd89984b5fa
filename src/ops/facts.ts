/** `facts`: reads each file; an unreadable one is a result with its error, and the rest are still read. */
import { InputError } from "../errors.js";
import type { ReadOptions } from "../extract/read.js";
import type { FactsResult } from "../report/facts.js";
import { codeEvidence } from "../score/code-evidence.js";
import { readAppFile } from "./read-manifest.js";

export interface FactsOptions extends ReadOptions {
  /** Read the app's dex code for code evidence (default true; archives only). */
  code?: boolean;
  onError?: (file: string, error: InputError) => void;
}

export function facts(files: readonly string[], options: FactsOptions = {}): FactsResult[] {
  return files.map((file): FactsResult => {
    try {
      // The manifest and (unless told not to) the code, in one opening of the file.
      const { manifest, dexes } = readAppFile(file, options, options.code !== false);
      return { file, manifest, ...(dexes?.length ? { code: codeEvidence(manifest, dexes) } : {}) };
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      options.onError?.(file, e);
      return { file, error: { kind: e.name, message: e.detail() } };
    }
  });
}
