/** `facts`: reads each file; an unreadable one is a result with its error, and the rest are still read. */
import { InputError } from "../errors.js";
import type { ReadOptions } from "../extract/read.js";
import type { FactsResult } from "../report/facts.js";
import { readManifestFile } from "./read-manifest.js";

export function facts(files: readonly string[], options: ReadOptions & { onError?: (file: string, error: InputError) => void } = {}): FactsResult[] {
  return files.map((file) => {
    try {
      return { file, manifest: readManifestFile(file, options) };
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      options.onError?.(file, e);
      return { file, error: { kind: e.name, message: e.detail() } };
    }
  });
}
