/**
 * File corpora: an index CSV (`file,category[,label]`, header optional, read by util/csv.ts) naming APKs or manifests,
 * relative to the index's folder. Each app's permissions come from overask's own manifest reader.
 */
import { CorpusError, InputError } from "../../errors.js";
import { indexLine } from "../../util/csv.js";
import type { Ledger } from "./common.js";
import type { CorpusOptions, CorpusRecord, CorpusSource } from "./types.js";

export async function* readFileIndex(source: CorpusSource, options: CorpusOptions, ledger: Ledger): AsyncGenerator<CorpusRecord> {
  if (!source.readApp) throw new CorpusError("is an index of app files, which this source cannot open", { file: source.name });
  for await (const { text, line } of source.lines(options.onProgress)) {
    const row = indexLine(text, line, "file");
    if (row.kind === "skip") continue;
    ledger.report.rows++;
    const f = row.kind === "row" ? row.fields : undefined;
    if (!f || f.length < 2 || f.length > 3 || f[0] === "") {
      ledger.reject(line, "expected file,category[,label]");
      continue;
    }
    let permissions: string[];
    let id: string;
    try {
      ({ id, permissions } = source.readApp(f[0]));
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      ledger.reject(line, e.describe());
      continue;
    }
    const record = ledger.accept(line, id, f[1], f[2], permissions);
    if (record) yield record;
  }
}
