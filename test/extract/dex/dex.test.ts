/**
 * The dex reader against Debian's `dexdump -d` (package dexdump) on dex files assembled by Debian's smali
 * (package libsmali-java) from fixtures/smali/: every class, and per class every method invoked, field
 * read or written and string loaded, as dexdump lists them (fixtures/dumps/*.dexdump.txt, written by
 * scripts/build-fixtures.sh). Malformed input is built inline.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { describe, expect, it } from "vitest";
import { DexError, LimitError } from "../../../src/errors.js";
import { classRefs, javaName, readDex, type DexFile } from "../../../src/extract/dex/dex.js";
import { DUMP_DIR, FIXTURES } from "../../helpers/paths.js";

interface DumpedClass {
  descriptor: string;
  methods: Set<string>;
  fields: Set<string>;
  strings: Set<string>;
}

/** Classes of a `dexdump -d` listing, with the references of their instructions. */
function parseDexdump(text: string): DumpedClass[] {
  const out: DumpedClass[] = [];
  let cur: DumpedClass | undefined;
  for (const line of text.split("\n")) {
    const c = /^ {2}Class descriptor {2}: '(.+)'$/.exec(line);
    if (c) out.push((cur = { descriptor: c[1], methods: new Set(), fields: new Set(), strings: new Set() }));
    if (!cur) continue;
    const m = /\|[0-9a-f]{4}: invoke-[\w/-]+ \{[^}]*\}, (L[^;]+;)\.([^:]+):\((.*?)\)(\S+) \/\/ method@/.exec(line);
    if (m) cur.methods.add(`${m[1]}.${m[2]}(${m[3]})${m[4]}`);
    const f = /\|[0-9a-f]{4}: [is](?:get|put)[\w-]* [^,]+, (?:[^,]+, )?(L[^;]+;)\.([^:]+):(\S+) \/\/ field@/.exec(line);
    if (f) cur.fields.add(`${f[1]}.${f[2]}:${f[3]}`);
    const s = /\|[0-9a-f]{4}: const-string(?:\/jumbo)? [^,]+, "(.*)" \/\/ string@/.exec(line);
    if (s) cur.strings.add(s[1]);
  }
  return out;
}

function ours(dex: DexFile): DumpedClass[] {
  return dex.classes.map((cls) => ({ cls, ...classRefs(dex, cls) })).map((c) => ({
    descriptor: c.cls.descriptor,
    methods: new Set(c.methodRefs.map((i) => dex.methods[i]).map((m) => `${m.owner}.${m.name}(${m.params.join("")})${m.returns}`)),
    fields: new Set(c.fieldRefs.map((i) => dex.fields[i]).map((f) => `${f.owner}.${f.name}:${f.type}`)),
    strings: new Set(c.stringRefs.map((i) => dex.strings[i])),
  }));
}

describe("readDex against dexdump", () => {
  for (const name of ["beamtorch-classes", "beamtorch-classes2"]) {
    it(`${name}.dex: the same classes and, per class, the same method, field and string references`, () => {
      const dex = readDex(readFileSync(`${FIXTURES}dex/${name}.dex`));
      const dumped = parseDexdump(readFileSync(`${DUMP_DIR}${name}.dexdump.txt`, "utf8"));
      expect(dumped.length).toBeGreaterThan(0);
      expect(ours(dex)).toEqual(dumped);
      expect(dex.version).toBe(/DEX version '(\d+)'/.exec(readFileSync(`${DUMP_DIR}${name}.dexdump.txt`, "utf8"))![1]);
    });
  }

  it("sees the framework calls the torch's code makes", () => {
    const dex = readDex(readFileSync(`${FIXTURES}dex/beamtorch-classes.dex`));
    const torch = classRefs(dex, dex.classes.find((c) => c.descriptor === "Lorg/example/beamtorch/Torch;")!);
    expect(torch.methodRefs.map((i) => `${javaName(dex.methods[i].owner)}.${dex.methods[i].name}`)).toContain("android.telephony.SmsManager.sendTextMessage");
    expect(torch.stringRefs.map((i) => dex.strings[i])).toContain("content://sms/inbox");
  });
});

describe("readDex on damaged input", () => {
  const good = readFileSync(`${FIXTURES}dex/beamtorch-classes.dex`);
  const patched = (at: number, value: number) => {
    const b = Uint8Array.from(good);
    new DataView(b.buffer).setUint32(at, value, true);
    return b;
  };

  it("refuses what is not a dex file, and versions it does not read", () => {
    expect(() => readDex(new TextEncoder().encode("PK\u0003\u0004 not a dex"))).toThrow(/no dex magic/);
    const v = Uint8Array.from(good);
    v.set(new TextEncoder().encode("099"), 4);
    expect(() => readDex(v)).toThrow(/dex version 099; versions 035 to 041/);
  });

  it("names the limit a lying count breaks", () => {
    expect(() => readDex(patched(0x38, 0xfffffff0))).toThrow(LimitError); // string_ids_size
    expect(() => readDex(patched(0x38, 0xfffffff0))).toThrow(/MAX_DEX_IDS/);
  });

  it("raises a DexError for tables or code that run past the end", () => {
    expect(() => readDex(patched(0x3c, good.length - 2))).toThrow(DexError); // string_ids_off near the end
    expect(() => readDex(good.subarray(0, 300))).toThrow(DexError);
  });

  it("writes descriptors as Java names", () => {
    expect(javaName("Landroid/telephony/SmsManager;")).toBe("android.telephony.SmsManager");
    expect(javaName("[[I")).toBe("int[][]");
    expect(javaName("[Ljava/lang/String;")).toBe("java.lang.String[]");
  });
});

describe("the committed dex fixtures are current", () => {
  // Debian's smali and dexdump (installed by .ci/run): reassembling the smali source gives a dex whose
  // dexdump listing equals the committed one, so the reader is checked against today's source.
  const have = (tool: string) => spawnSync(tool, ["--version"], { stdio: "ignore" }).error === undefined;
  it.skipIf(!have("smali") || !have("dexdump"))("reassembles fixtures/smali with smali and dexdump lists the same", ({ skip }) => {
    const dir = mkdtempSync(`${tmpdir()}/overask-dex-`);
    try {
      for (const part of ["classes", "classes2"]) {
        const out = `${dir}/${part}.dex`;
        const made = spawnSync("smali", ["assemble", "-o", out, `${FIXTURES}smali/beamtorch/${part}/`], { encoding: "utf8" });
        if (made.status !== 0) skip();
        const listing = spawnSync("dexdump", ["-d", out], { encoding: "utf8" }).stdout;
        const committed = readFileSync(`${DUMP_DIR}beamtorch-${part}.dexdump.txt`, "utf8");
        // The listing names the file it read; the rest must match line for line.
        const body = (s: string) => s.split("\n").filter((l) => !l.startsWith("Processing '") && !l.startsWith("Opened '")).join("\n");
        expect(body(listing)).toBe(body(committed));
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
