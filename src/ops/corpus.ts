/**
 * Corpora on disk: a file adapted to the baseline layer's CorpusSource (streamed lines with progress by
 * bytes, apps of an index CSV read with overask's own manifest reader), and the side files the options
 * name (`--columns-from`).
 */
import { closeSync, createReadStream, openSync, readSync, statSync } from "node:fs";
import { createInterface } from "node:readline";
import { dirname, resolve } from "node:path";
import { openCorpus, parseColumnList, type Corpus } from "../baseline/corpus/index.js";
import type { CorpusOptions, CorpusSource } from "../baseline/corpus/types.js";
import { CorpusError } from "../errors.js";
import { requestedPermissionNames } from "../extract/manifest/model.js";
import { readTextFile } from "./files.js";
import { readManifestFile } from "./read-manifest.js";

/** Corpus options as a user gives them: the column list is a file to read. */
export interface CorpusFileOptions extends Omit<CorpusOptions, "columns"> {
  /** Wide CSV: a file naming the permission columns (first CSV column), optionally filtered by its second column. */
  columnsFrom?: string;
  columnsKind?: string;
}

/** A corpus file as a CorpusSource. Fails at once, naming the file, when it cannot be opened. */
export function corpusFile(path: string): CorpusSource {
  let size: number;
  try {
    const st = statSync(path);
    if (st.isDirectory()) throw new CorpusError("is a directory; give the corpus file (JSONL, wide CSV or an index CSV)", { file: path });
    size = st.size;
  } catch (e) {
    if (e instanceof CorpusError) throw e;
    const code = (e as { code?: string }).code;
    throw new CorpusError(code === "ENOENT" ? "no such file" : String((e as Error).message), { file: path });
  }
  const base = dirname(path);
  return {
    name: path,
    head() {
      const fd = openSync(path, "r");
      try {
        const head = Buffer.alloc(4096);
        const n = readSync(fd, head, 0, head.length, 0);
        return head.toString("utf8", 0, n);
      } finally {
        closeSync(fd);
      }
    },
    async *lines(onProgress) {
      const stream = createReadStream(path, { encoding: "utf8", highWaterMark: 1 << 20 });
      const rl = createInterface({ input: stream, crlfDelay: Infinity });
      let line = 0;
      let done = 0;
      let lastReport = 0;
      for await (const text of rl) {
        line++;
        done += text.length + 1;
        if (onProgress && done - lastReport > 1 << 20) {
          lastReport = done;
          onProgress(Math.min(done, size), size);
        }
        yield { text, line };
      }
      onProgress?.(size, size);
    },
    readApp(listed) {
      const m = readManifestFile(resolve(base, listed));
      return { id: m.package, permissions: requestedPermissionNames(m) };
    },
  };
}

/** Turns file options into reader options: reads the `--columns-from` list. */
export function corpusReaderOptions(options: CorpusFileOptions): CorpusOptions {
  const { columnsFrom, columnsKind, ...rest } = options;
  if (!columnsFrom) return rest;
  return { ...rest, columns: parseColumnList(readTextFile(columnsFrom, CorpusError), columnsFrom, columnsKind) };
}

/** Opens a corpus file in any of its formats (told from the content unless `format` is given). */
export function openCorpusFile(path: string, options: CorpusFileOptions = {}): Corpus {
  return openCorpus(corpusFile(path), corpusReaderOptions(options));
}
