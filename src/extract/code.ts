/**
 * The app's dex code, read from an archive already opened: `classes.dex`, `classes2.dex` … of an APK,
 * `<module>/dex/classes*.dex` of an app bundle, and the dex of each APK inside a multi-APK archive. A
 * damaged dex costs only its own evidence: it comes back with the problem, the others are still read.
 */
import { InputError } from "../errors.js";
import { LIMITS } from "../limits.js";
import { openArchiveBytes, type ArchiveReader } from "./containers/zip.js";
import { NESTED_APK } from "./containers/multi-apk.js";
import { readDex, type DexFile } from "./dex/dex.js";

/** One dex of the app: read, or the problem that stopped it. */
export interface DexInput {
  /** Entry name in the archive: `classes.dex`, `base/dex/classes2.dex`, `split.apk!classes.dex` … */
  entry: string;
  dex?: DexFile;
  problem?: string;
}

/** Dex entries of an APK (`classes.dex`, `classes2.dex` …) or of an app bundle module (`base/dex/classes.dex`). */
export const DEX_ENTRY = /^(?:[^/]+\/dex\/)?classes\d*\.dex$/;


/** Reads every dex of the archive; entries are taken in their natural order (classes, classes2 … classes10). */
export function readDexEntries(archive: ArchiveReader, prefix = ""): DexInput[] {
  const names = archive.entries().map((e) => e.name);
  const dexNames = names.filter((n) => DEX_ENTRY.test(n)).sort(naturalOrder);
  const out: DexInput[] = [];
  const nested = dexNames.length === 0 ? names.filter((n) => NESTED_APK.test(n)).sort(naturalOrder) : [];
  if (dexNames.length > LIMITS.MAX_DEX_FILES) {
    return [{ entry: `${prefix}${dexNames.length} dex files`, problem: `more dex files than MAX_DEX_FILES (${LIMITS.MAX_DEX_FILES}); none read` }];
  }
  for (const name of dexNames) {
    try {
      out.push({ entry: prefix + name, dex: readDex(archive.read(name, "MAX_DEX_BYTES")) });
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      out.push({ entry: prefix + name, problem: e.detail() });
    }
  }
  for (const apk of nested) {
    try {
      const inner = openArchiveBytes(archive.read(apk, "MAX_NESTED_APK_BYTES"), (n) => DEX_ENTRY.test(n));
      try {
        out.push(...readDexEntries(inner, `${apk}!`));
      } finally {
        inner.close();
      }
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      out.push({ entry: apk, problem: e.detail() });
    }
    if (out.length > LIMITS.MAX_DEX_FILES) return [...out.slice(0, LIMITS.MAX_DEX_FILES), { entry: "(rest)", problem: `more dex files than MAX_DEX_FILES (${LIMITS.MAX_DEX_FILES}); the rest not read` }];
  }
  return out;
}

function naturalOrder(a: string, b: string): number {
  return a.localeCompare(b, "en", { numeric: true });
}
