/**
 * Applies a trim plan to the text of a plain source manifest, changing only the elements concerned and
 * leaving every other line, comment and indentation as it was.
 */
import { InputError } from "../../errors.js";
import { TOOLS_NS } from "../../extract/xml-tree.js";
import type { TrimCandidate, TrimPlan } from "./plan.js";
import { snippetFor } from "./plan.js";

interface Edit {
  at: number;
  remove: number;
  insert: string;
}

function lineOffsets(text: string): number[] {
  const starts = [0];
  for (let i = text.indexOf("\n"); i !== -1; i = text.indexOf("\n", i + 1)) starts.push(i + 1);
  return starts;
}

/** The [start, end) of the element whose start tag begins on `line` (1-based), by its tag name. */
function elementSpan(text: string, starts: number[], line: number, tag: string): { start: number; end: number; tagEnd: number } {
  const from = starts[line - 1] ?? 0;
  const start = text.indexOf(`<${tag}`, from);
  if (start < 0) throw new InputError(`line ${line}: no <${tag}> where the manifest was read`);
  const tagEnd = text.indexOf(">", start); // end of the start tag
  if (tagEnd < 0) throw new InputError(`line ${line}: unterminated <${tag}>`);
  if (text[tagEnd - 1] === "/") return { start, end: tagEnd + 1, tagEnd: tagEnd - 1 };
  const close = text.indexOf(`</${tag}>`, tagEnd);
  if (close < 0) throw new InputError(`line ${line}: <${tag}> is never closed`);
  return { start, end: close + tag.length + 3, tagEnd };
}

export function patchManifest(text: string, plan: TrimPlan, candidates: TrimCandidate[] = plan.candidates): string {
  const eol = text.includes("\r\n") ? "\r\n" : "\n";
  const starts = lineOffsets(text);
  const edits: Edit[] = [];
  const merged: TrimCandidate[] = [];
  for (const c of candidates) {
    if (c.action.kind === "merge-remove") {
      merged.push(c);
      continue;
    }
    const el = c.element;
    if (!el?.source.line) continue; // not in this file: nothing to change here
    const span = elementSpan(text, starts, el.source.line, el.element);
    if (c.action.kind === "delete") {
      // Remove the element; take its whole line when nothing else stands on it.
      const lineStart = text.lastIndexOf("\n", span.start - 1) + 1;
      let lineEnd = text.indexOf("\n", span.end);
      if (lineEnd < 0) lineEnd = text.length;
      const alone = text.slice(lineStart, span.start).trim() === "" && text.slice(span.end, lineEnd).trim() === "";
      if (alone) edits.push({ at: lineStart, remove: Math.min(text.length, lineEnd + 1) - lineStart, insert: "" });
      else edits.push({ at: span.start, remove: span.end - span.start, insert: "" });
    } else {
      const startTag = text.slice(span.start, span.tagEnd);
      const existing = /\s(\w+):maxSdkVersion\s*=\s*("[^"]*"|'[^']*')/.exec(startTag);
      if (existing) {
        const at = span.start + existing.index + existing[0].indexOf(existing[2]);
        edits.push({ at, remove: existing[2].length, insert: `"${c.action.maxSdkVersion}"` });
      } else {
        const prefix = androidPrefix(text);
        let at = span.tagEnd;
        while (at > span.start && /\s/.test(text[at - 1])) at--;
        edits.push({ at, remove: 0, insert: ` ${prefix}:maxSdkVersion="${c.action.maxSdkVersion}"` });
      }
    }
  }
  if (merged.length) {
    const toolsPrefix = declaredPrefix(text, TOOLS_NS);
    const prefix = toolsPrefix ?? "tools";
    // New elements go after the last <uses-permission…>, in its indentation, or before <application>.
    const lastUse = Math.max(text.lastIndexOf("<uses-permission"), -1);
    let at: number;
    let indent = "    ";
    if (lastUse >= 0) {
      const lineStart = text.lastIndexOf("\n", lastUse - 1) + 1;
      indent = text.slice(lineStart, lastUse).replace(/\S.*$/, "");
      const end = text.indexOf(">", lastUse);
      const nl = text.indexOf("\n", end);
      at = nl < 0 ? text.length : nl + 1;
    } else {
      const app = text.indexOf("<application");
      const close = text.lastIndexOf("</manifest>");
      const anchor = app >= 0 ? app : close;
      at = text.lastIndexOf("\n", anchor - 1) + 1;
    }
    const lines = merged.map((c) => `${indent}${snippetFor(c).replace(/ tools:node=/, ` ${prefix}:node=`).replace(/android:/g, `${androidPrefix(text)}:`)}${eol}`).join("");
    edits.push({ at, remove: 0, insert: lines });
    if (!toolsPrefix) {
      const m = /<manifest\b/.exec(text);
      if (!m) throw new InputError("no <manifest> start tag");
      const androidDecl = /\sxmlns:\w+\s*=\s*"http:\/\/schemas\.android\.com\/apk\/res\/android"/.exec(text.slice(m.index));
      const insertAt = androidDecl ? m.index + androidDecl.index + androidDecl[0].length : m.index + m[0].length;
      edits.push({ at: insertAt, remove: 0, insert: ` xmlns:tools="${TOOLS_NS}"` });
    }
  }
  edits.sort((a, b) => b.at - a.at);
  let out = text;
  for (const e of edits) out = out.slice(0, e.at) + e.insert + out.slice(e.at + e.remove);
  return out;
}

function declaredPrefix(text: string, uri: string): string | undefined {
  const escaped = uri.replace(/[.*+?^${}()|[\]\\/]/g, "\\$&");
  return new RegExp(`xmlns:(\\w+)\\s*=\\s*["']${escaped}["']`).exec(text)?.[1];
}

function androidPrefix(text: string): string {
  return declaredPrefix(text, "http://schemas.android.com/apk/res/android") ?? "android";
}
