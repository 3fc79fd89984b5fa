/**
 * File corpora: an index CSV (`file,category[,label]`, header optional) naming APKs or manifests,
 * relative to the index's folder. Each app's permissions come from overask's own manifest reader.
 */
import { dirname, resolve } from "node:path";
import { InputError } from "../../errors.js";
import { readManifestFile } from "../../extract/index.js";
import { requestedPermissionNames } from "../../extract/manifest/model.js";
import { Ledger, lines } from "./common.js";
import { splitCsvLine } from "../../util/csv.js";
import type { CorpusOptions, CorpusRecord } from "./types.js";

export async function* readFileIndex(path: string, options: CorpusOptions, ledger: Ledger): AsyncGenerator<CorpusRecord> {
  const base = dirname(path);
  for await (const { text, line } of lines(path, options.onProgress)) {
    if (text.trim() === "") continue;
    const f = splitCsvLine(text);
    if (line === 1 && f?.[0]?.trim().toLowerCase() === "file") continue; // header
    ledger.report.rows++;
    if (!f || f.length < 2 || f.length > 3 || f[0].trim() === "") {
      ledger.reject(line, "expected file,category[,label]");
      continue;
    }
    const file = resolve(base, f[0].trim());
    let permissions: string[];
    let id: string;
    try {
      const m = readManifestFile(file);
      permissions = requestedPermissionNames(m);
      id = m.package;
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      ledger.reject(line, e.describe());
      continue;
    }
    const record = ledger.accept(line, id, f[1].trim(), f[2], permissions);
    if (record) yield record;
  }
}
