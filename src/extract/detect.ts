/** Telling what kind of input some bytes are, from their first bytes only (never from a file name). */
import { looksLikeBinaryXml } from "./binary/binary-xml.js";
import { looksLikeZip } from "./containers/zip.js";
import { looksLikeProtoXml } from "./proto/proto-xml.js";

export type DetectedKind = "zip" | "binary-xml" | "plain-xml" | "proto-xml" | "unknown";

/** How many leading bytes `detectKind` looks at. */
export const DETECT_BYTES = 64;

/** Tells the input kind from its first bytes. */
export function detectKind(head: Uint8Array): DetectedKind {
  if (looksLikeZip(head)) return "zip";
  if (looksLikeBinaryXml(head)) return "binary-xml";
  // Text: optional BOM, optional whitespace, then '<'.
  let i = 0;
  if (head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) i = 3;
  else if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) return "plain-xml";
  while (i < head.length && (head[i] === 0x20 || head[i] === 0x09 || head[i] === 0x0a || head[i] === 0x0d)) i++;
  if (head[i] === 0x3c) return "plain-xml";
  return looksLikeProtoXml(head) ? "proto-xml" : "unknown";
}
