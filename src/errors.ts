/**
 * The typed errors overask raises for bad input. Everything a user can cause by handing us a file
 * is one of these; anything else escaping the library is a bug in overask.
 *
 * Each error carries the file it concerns (when known) so that the CLI can print one line:
 * `<file>: <message>`.
 */

/** Problems a caller may know how to fix, named in `OveraskError.code`. */
export type ErrorCode = "labels-one-class" | "validation-labels-one-class" | "fold-parameters-differ" | "fold-same-baseline" | "reject-limit";

/**
 * Base of every error overask raises about something outside it: an input, an output, a queue. It names
 * the file (or address) and, inside an archive, the entry, so the CLI prints one line for a person.
 */
export class OveraskError extends Error {
  override name = "OveraskError";
  /** Path or label of the input concerned; set by whoever knows it (often the caller, after the fact). */
  file?: string;
  /** The archive entry concerned (`split_a.apk`, `feature/manifest/AndroidManifest.xml`), when inside one. */
  entry?: string;
  /**
   * What kind of problem, for a caller that knows how to fix it: the CLI names its own options for a code
   * (cli/hints.ts); the library's messages never name command-line options.
   */
  code?: ErrorCode;
  constructor(message: string, options?: { file?: string; entry?: string; cause?: unknown; code?: ErrorCode }) {
    super(message, options?.cause === undefined ? undefined : { cause: options.cause });
    this.file = options?.file;
    if (options?.entry !== undefined) this.entry = options.entry;
    if (options?.code !== undefined) this.code = options.code;
  }
  /** What is wrong, with the archive entry when there is one: `entry: message`. */
  detail(): string {
    return this.entry ? `${this.entry}: ${this.message}` : this.message;
  }
  /** One line for a person: `file: entry: message`. */
  describe(): string {
    return this.file ? `${this.file}: ${this.detail()}` : this.detail();
  }
}

/** Base class: the input (a file, bytes, a record) cannot be read as what it claims to be. */
export class InputError extends OveraskError {
  override name = "InputError";
}

/** The sweep's queue (Redis) cannot be reached or used; `file` is its address, shown without password. */
export class QueueError extends OveraskError {
  override name = "QueueError";
}

/** An output file cannot be written (full disk, read-only or missing folder). */
export class OutputError extends OveraskError {
  override name = "OutputError";
}

/** The zip container is damaged, lies about itself or lacks the manifest. */
export class ArchiveError extends InputError {
  override name = "ArchiveError";
}

/** The Android binary XML (chunked "AXML") cannot be decoded. */
export class BinaryXmlError extends InputError {
  override name = "BinaryXmlError";
}

/** A protobuf XML manifest or resource table (app bundles, `aapt2 --proto-format`) cannot be decoded. */
export class ProtoXmlError extends InputError {
  override name = "ProtoXmlError";
}

/** A Dalvik executable (classes.dex) cannot be read. */
export class DexError extends InputError {
  override name = "DexError";
}

/** The resource table (resources.arsc) cannot be decoded. */
export class ResourceTableError extends InputError {
  override name = "ResourceTableError";
}

/** A plain-text XML manifest cannot be parsed, or uses a construct we refuse (DTDs, entities). */
export class PlainXmlError extends InputError {
  override name = "PlainXmlError";
}

/** The XML decoded, but it is not an Android manifest (no <manifest> root, no package). */
export class ManifestError extends InputError {
  override name = "ManifestError";
}

/** A corpus cannot be read, or too much of it was rejected. */
export class CorpusError extends InputError {
  override name = "CorpusError";
}

/** A baseline file cannot be used (wrong schema version, damaged, inconsistent counts). */
export class BaselineError extends InputError {
  override name = "BaselineError";
}

/** A length, count, size or depth read from the input exceeds a named limit. */
export class LimitError extends InputError {
  override name = "LimitError";
  constructor(
    readonly limitName: string,
    readonly found: number,
    readonly allowed: number,
    what: string,
    options?: { file?: string },
  ) {
    super(`${what} ${found}; the limit (${limitName}) is ${allowed}`, options);
  }
}

/**
 * The command line is wrong in a way the option parser cannot see (a bad combination, an unknown check
 * id, a category the baseline does not have). Not an InputError: no file is at fault.
 */
export class UsageError extends Error {
  override name = "UsageError";
}

/** Attach a file name to an InputError that was raised without one (decoders do not know paths). */
export function withFile<E>(error: E, file: string): E {
  if (error instanceof OveraskError && error.file === undefined) error.file = file;
  return error;
}

/** Attach an archive entry name to an InputError raised while reading that entry (innermost entry wins). */
export function withEntry<E>(error: E, entry: string): E {
  if (error instanceof OveraskError) error.entry = error.entry === undefined ? entry : `${entry}: ${error.entry}`;
  return error;
}
