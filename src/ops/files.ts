/**
 * Files, once: reading text with a one-line error, writing atomically, and turning the file system's
 * error codes into words a person can act on.
 */
import { closeSync, fsyncSync, openSync, readFileSync, renameSync, unlinkSync, writeSync } from "node:fs";
import { basename, dirname, join } from "node:path";
import { InputError, OutputError } from "../errors.js";

/** An InputError in the user's words for a file-system error; anything else is returned as it is. */
export function fsError(e: unknown): unknown {
  if (e instanceof InputError) return e;
  const code = (e as { code?: string }).code;
  if (code === "ENOENT") return new InputError("no such file");
  if (code === "EACCES" || code === "EPERM") return new InputError("permission denied");
  if (code === "EISDIR") return new InputError("is a directory, not a file");
  // A socket (or a device with no driver) cannot be opened at all.
  if (code === "ENXIO" || code === "ENODEV") return new InputError("is not a regular file (a device, FIFO or socket); give an APK or manifest file");
  return e;
}

/**
 * Reads a text file, raising `ErrorType` (an InputError subclass) with the file named when it cannot:
 * `no such file`, `permission denied`, `is a directory, not a file`, or the system's own words.
 */
export function readTextFile(path: string, ErrorType: new (message: string, options?: { file?: string }) => InputError = InputError): string {
  try {
    return readFileSync(path, "utf8");
  } catch (e) {
    const mapped = fsError(e);
    throw new ErrorType(mapped instanceof InputError ? mapped.message : `cannot be read (${(e as Error).message})`, { file: path });
  }
}

/** Writes `text` to `path` atomically: a temporary file beside it, flushed, then renamed over it. */
export function writeFileAtomic(path: string, text: string): void {
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.${Date.now().toString(36)}.tmp`);
  let fd: number | undefined;
  try {
    fd = openSync(tmp, "wx", 0o644);
    writeSync(fd, text);
    fsyncSync(fd);
    closeSync(fd);
    fd = undefined;
    renameSync(tmp, path);
  } catch (e) {
    if (fd !== undefined) closeSync(fd);
    try { unlinkSync(tmp); } catch { /* never created */ }
    throw new OutputError(`cannot be written: ${outputProblem(e)}`, { file: path });
  }
}

/** Why an output could not be written, in a person's words. */
export function outputProblem(e: unknown): string {
  const code = (e as { code?: string }).code;
  return code === "ENOSPC" ? "the disk is full" : code === "EACCES" || code === "EPERM" || code === "EROFS" ? "the folder is not writable" : code === "ENOENT" ? "the folder does not exist" : (e as Error).message;
}
