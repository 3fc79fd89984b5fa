/**
 * Inputs the fuzzer (scripts/fuzz.mjs) once found breaking an invariant, minimized and kept in
 * fixtures/crashers/. Each must now end in a typed error (or be read). How long each takes is checked by
 * the fuzz harness's watchdog (scripts/fuzz.mjs replays them first), not here: no timed unit tests.
 */
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { ResourceTable } from "../../src/extract/binary/resource-table.js";
import { openCorpusFile as openCorpus } from "../../src/ops/corpus.js";
import { InputError } from "../../src/errors.js";
import { readManifestBytes } from "../../src/extract/index.js";
import { FIXTURES } from "../helpers/paths.js";

const index = JSON.parse(readFileSync(`${FIXTURES}crashers/index.json`, "utf8")) as { name: string; kind: string; found: string; problem: string }[];
const tmp = mkdtempSync(join(tmpdir(), "overask-crashers-"));

async function replay(kind: string, bytes: Uint8Array): Promise<void> {
  if (kind === "file") readManifestBytes(bytes, "crasher");
  else if (kind === "arsc") new ResourceTable(bytes).resolve(0x7f010000);
  else {
    const path = join(tmp, `c.${kind}`);
    writeFileSync(path, bytes);
    for await (const _ of openCorpus(path, { format: kind === "csv" ? "wide-csv" : "jsonl" }).records);
  }
}

describe("fuzzer finds, replayed", () => {
  it("has its index", () => {
    expect(index.length).toBeGreaterThan(0);
  });
  for (const c of index) {
    it(`${c.name} (${c.problem}; ${c.found}) ends in a typed error or a result`, async () => {
      const bytes = readFileSync(`${FIXTURES}crashers/${c.name}.bin`);
      let error: unknown;
      try {
        await replay(c.kind, bytes);
      } catch (e) {
        error = e;
      }
      if (error !== undefined) expect(error).toBeInstanceOf(InputError);
    });
  }
});
