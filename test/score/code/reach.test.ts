/**
 * The call graph: class hierarchy analysis (Dean, Grove & Chambers, ECOOP 1995) refined by rapid type
 * analysis (Bacon & Sweeney, OOPSLA 1996), on the papers' worked example hand-translated to smali
 * (fixtures/smali/callgraph, assembled by Debian's smali; dexdump's listing in fixtures/dumps).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDex } from "../../../src/extract/dex/dex.js";
import { Program } from "../../../src/score/code/program.js";
import { reachability } from "../../../src/score/code/reach.js";
import { DUMP_DIR, FIXTURES } from "../../helpers/paths.js";

const dex = readDex(readFileSync(`${FIXTURES}dex/callgraph-classes.dex`));

function reachedFoo(cha: boolean): string[] {
  const p = new Program([dex]);
  const main = p.classes.get("Lorg/example/cg/Main;")!.methods.get("main([Ljava/lang/String;)V")!;
  const r = reachability(p, [], { roots: [main], cha });
  return p.methods.filter((m) => r.reached[m.id] && m.name === "foo").map((m) => m.cls.descriptor.slice("Lorg/example/cg/".length, -1)).sort();
}

describe("call graph on the published algorithms' worked example", () => {
  it("is read from a dex whose calls dexdump lists as the smali source wrote them", () => {
    // Debian's dexdump: the one virtual call is to A.foo, whatever object main made.
    expect(readFileSync(`${DUMP_DIR}callgraph-classes.dexdump.txt`, "utf8")).toMatch(/invoke-virtual \{v0\}, Lorg\/example\/cg\/A;\.foo:\(\)V/);
  });

  it("CHA: a call of A.foo may land on A, B, C and D", () => {
    expect(reachedFoo(true)).toEqual(["A", "B", "C", "D"]);
  });

  it("RTA: only on the classes created in reached code, B and D, whichever comes first, the call or the creation", () => {
    expect(reachedFoo(false)).toEqual(["B", "D"]);
  });
});
