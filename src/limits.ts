/**
 * Named caps on everything read from untrusted input. Every length, count, offset or size taken from
 * a file is checked against one of these before it is used, and a breach raises a LimitError naming it.
 *
 * The values are generous for real apps: the platform's own framework manifest (the largest manifest
 * there is, API 29) is 222,464 bytes with 4,700 strings and about 3,000 elements.
 */
export const LIMITS = {
  /** Largest manifest (binary or plain) we will decode, in bytes, after inflation. */
  MAX_MANIFEST_BYTES: 16 * 1024 * 1024,
  /** Largest resources.arsc we will read to resolve labels; real apps reach tens of MB. */
  MAX_RESOURCE_TABLE_BYTES: 128 * 1024 * 1024,
  /** Largest APK inside a multi-APK archive that we read into memory. */
  MAX_NESTED_APK_BYTES: 512 * 1024 * 1024,
  /** Largest compression ratio an archive entry may claim or show (inflated / compressed). */
  MAX_COMPRESSION_RATIO: 1000,
  /** Most entries we accept in an archive's central directory. */
  MAX_ARCHIVE_ENTRIES: 500_000,
  /** Strings in one string pool. */
  MAX_STRING_COUNT: 2_000_000,
  /** UTF-16 units or UTF-8 bytes in one pool string. */
  MAX_STRING_LENGTH: 1_000_000,
  /** Elements in one XML document. */
  MAX_ELEMENT_COUNT: 1_000_000,
  /** Attributes on one element. */
  MAX_ATTRIBUTE_COUNT: 10_000,
  /** Nesting depth of elements. */
  MAX_DEPTH: 256,
  /** Entries in one resource type chunk. */
  MAX_TYPE_ENTRIES: 1_000_000,
  /** Largest dex file we read (classes.dex of big apps reach tens of MB). */
  MAX_DEX_BYTES: 256 * 1024 * 1024,
  /** Entries in one dex id table (strings, types, protos, fields, methods, classes). */
  MAX_DEX_IDS: 4_000_000,
  /** 16-bit code units of instructions in one dex file, all methods together. */
  MAX_DEX_CODE_UNITS: 200_000_000,
  /** Methods the app's dex files define, all together, beyond which no call graph is built (evidence is then shown without reachability). */
  MAX_CALL_GRAPH_METHODS: 3_000_000,
  /** Dex files read from one app (classes.dex, classes2.dex … across a bundle's modules). */
  MAX_DEX_FILES: 512,
  /** Hops when a string resource refers to another resource. */
  MAX_REFERENCE_HOPS: 8,
} as const;

export type LimitName = keyof typeof LIMITS;
