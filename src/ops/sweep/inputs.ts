/**
 * What a sweep reads: every APK, bundle or manifest under a folder (told by content), the files named in a
 * list (one path a line), or an index CSV (`file,category`). Paths in lists and indexes are relative to
 * the list's folder. The order is sorted by id, so that runs and shards are stable.
 */
import { closeSync, openSync, readFileSync, readSync, readdirSync, statSync } from "node:fs";
import { join, relative, resolve, dirname, sep } from "node:path";
import { indexRows } from "../../util/csv.js";
import { InputError, UsageError } from "../../errors.js";
import { decodeBinaryXml } from "../../extract/binary/binary-xml.js";
import { DETECT_BYTES, detectKind } from "../../extract/detect.js";
import { namedLikeInput, namedLikeManifest } from "../../extract/kinds.js";
import { fnv1a32 } from "../../util/hash.js";
import type { SweepInput } from "./rows.js";

function head(path: string, bytes = DETECT_BYTES): Uint8Array {
  const fd = openSync(path, "r");
  try {
    const b = Buffer.alloc(bytes);
    const n = readSync(fd, b, 0, bytes, 0);
    return b.subarray(0, n);
  } finally {
    closeSync(fd);
  }
}

/** How much of an XML file is read to find its root element. */
const XML_PEEK_BYTES = 8192;

/**
 * Whether an .xml file found in a folder is plainly not a manifest: a source tree holds resource files
 * (res/values/strings.xml, layouts) that are no apps. Plain XML whose root element is not <manifest>, or
 * compiled XML whose root is not, is skipped; anything unclear is kept (and reported if it fails).
 */
export function plainlyNotManifest(path: string): boolean {
  let bytes: Uint8Array;
  try {
    bytes = head(path, XML_PEEK_BYTES);
  } catch {
    return false;
  }
  const kind = detectKind(bytes.subarray(0, DETECT_BYTES));
  if (kind === "plain-xml") {
    const text = new TextDecoder().decode(bytes).replace(/<\?[\s\S]*?\?>|<!--[\s\S]*?-->|<!DOCTYPE[^>]*>/g, "");
    const root = /<([A-Za-z_][\w:.-]*)/.exec(text);
    return root !== null && root[1] !== "manifest";
  }
  if (kind === "binary-xml") {
    try {
      return decodeBinaryXml(readFileSync(path)).root.name !== "manifest";
    } catch {
      return false;
    }
  }
  return false;
}

/** What a folder walk passed over. */
export interface WalkReport {
  /** .xml files whose root element is not <manifest>. */
  notManifests: number;
}

function walk(root: string, dir: string, out: SweepInput[], report: WalkReport): void {
  for (const entry of readdirSync(dir, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : 1))) {
    if (entry.name.startsWith(".")) continue;
    const path = join(dir, entry.name);
    if (entry.isDirectory()) walk(root, path, out, report);
    else if (entry.isFile()) {
      // A folder holds other things too (notes, images). Files named like apps are taken as they are
      // (reading tells what they really are, and reports them if they are not); others only when their
      // first bytes look like an app or a manifest.
      if (!namedLikeInput(entry.name)) {
        let kind;
        try {
          kind = detectKind(head(path));
        } catch {
          kind = "unknown";
        }
        if (kind === "unknown") continue;
      } else if (namedLikeManifest(entry.name) && plainlyNotManifest(path)) {
        report.notManifests++;
        continue;
      }
      const st = statSync(path);
      out.push({ id: relative(root, path).split(sep).join("/"), file: path, size: st.size, mtimeMs: Math.round(st.mtimeMs) });
    }
  }
}

function fileInput(base: string, listed: string, category?: string): SweepInput {
  const file = resolve(base, listed);
  let size = -1;
  let mtimeMs = -1;
  try {
    const st = statSync(file);
    size = st.size;
    mtimeMs = Math.round(st.mtimeMs);
  } catch {
    /* missing: it becomes a failed row */
  }
  return { id: listed, file, size, mtimeMs, ...(category ? { category } : {}) };
}

/**
 * What a source is: a folder to walk; a single app file (an APK, bundle, archive or manifest, told by
 * content); an index CSV (`file,category`); a list of paths, one a line. Anything else — binary data that is
 * no app, an XML file that is no manifest — is a usage error: sweeping it line by line would only make
 * rows of garbage.
 */
export function sourceKind(source: string): "folder" | "app" | "index" | "list" {
  const st = statSync(source);
  if (st.isDirectory()) return "folder";
  if (!st.isFile()) throw new UsageError(`${source} is not a regular file or a folder`);
  const bytes = head(source, XML_PEEK_BYTES);
  const kind = detectKind(bytes.subarray(0, DETECT_BYTES));
  if (kind === "zip" || kind === "binary-xml" || kind === "proto-xml") return "app";
  if (kind === "plain-xml") {
    if (plainlyNotManifest(source)) throw new UsageError(`${source} is an XML file but not a manifest; give an app, a folder, a list of files or an index CSV`);
    return "app";
  }
  const text = bytes.length ? new TextDecoder("utf-8", { fatal: false }).decode(bytes) : "";
  if (bytes.includes(0) || text.includes("\ufffd")) throw new UsageError(`${source} is neither an app nor a text list of files (binary content); give an app, a folder, a list of files or an index CSV`);
  const lines = text.split(/\r?\n/).map((l) => l.trim()).filter((l) => l && !l.startsWith("#"));
  if (lines.length > 0 && (lines[0].toLowerCase().startsWith("file,") || lines.every((l) => l.includes(",")))) return "index";
  // A list holds paths; JSON, XML or other structured text is not one (a path rarely has these characters).
  const notPath = lines.find((l) => /[{}[\]"<>]/.test(l));
  if (notPath !== undefined) throw new UsageError(`${source} is a text file but not a list of app files (a line reads "${notPath.slice(0, 40)}"); give an app, a folder, a list of files (one path a line) or an index CSV`);
  return "list";
}

export function listInputs(source: string, report: WalkReport = { notManifests: 0 }): SweepInput[] {
  let kind;
  try {
    kind = sourceKind(source);
  } catch (e) {
    if (e instanceof UsageError) throw e;
    throw new InputError("no such file or folder", { file: source });
  }
  const out: SweepInput[] = [];
  if (kind === "folder") walk(source, source, out, report);
  else if (kind === "app") {
    const st = statSync(source);
    out.push({ id: source, file: source, size: st.size, mtimeMs: Math.round(st.mtimeMs) });
  } else {
    const base = dirname(source);
    const text = readFileSync(source, "utf8");
    if (kind === "index") {
      for (const { line, fields: f } of indexRows(text, "file")) {
        if (!f || !f[0]) throw new InputError(`line ${line}: expected file,category`, { file: source });
        out.push(fileInput(base, f[0], f[1] || undefined));
      }
    } else {
      for (const line of text.split(/\r?\n/)) {
        const t = line.trim();
        if (t && !t.startsWith("#")) out.push(fileInput(base, t));
      }
    }
  }
  out.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return out;
}

/** 32-bit FNV-1a of the id: a stable way to split inputs into shards on any machine. */
export function shardOf(id: string, n: number): number {
  return fnv1a32(id) % n;
}

/** Parses `i/n` (1-based): this machine takes the inputs whose shard is i−1. Undefined when malformed. */
export function parseShard(spec: string): { index: number; count: number } | undefined {
  const m = /^(\d+)\/(\d+)$/.exec(spec);
  if (!m) return undefined;
  const index = Number(m[1]);
  const count = Number(m[2]);
  return count >= 1 && index >= 1 && index <= count ? { index, count } : undefined;
}
