/**
 * The call graph: class hierarchy analysis (Dean, Grove & Chambers, ECOOP 1995) refined by rapid type
 * analysis (Bacon & Sweeney, OOPSLA 1996), on the papers' worked example hand-translated to smali
 * (fixtures/smali/callgraph, assembled by Debian's smali; dexdump's listing in fixtures/dumps), and on
 * hierarchies that lie.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDex, type DexClass, type DexFile } from "../../../src/extract/dex/dex.js";
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

/** A dex of hand-made classes: just what the program reads. */
function fakeDex(classes: { d: string; sup?: string; interfaces?: string[] }[]): DexFile {
  const defs: DexClass[] = classes.map((c) => ({ descriptor: c.d, ...(c.sup ? { superclass: c.sup } : {}), interfaces: c.interfaces ?? [], accessFlags: 1, methodRefs: [], fieldRefs: [], stringRefs: [], methods: [] }));
  return { classes: defs, methodCount: 0, code: new Int32Array(0), method: () => { throw new Error("no methods"); } } as unknown as DexFile;
}

describe("hierarchies that lie", () => {
  it("cuts a superclass loop and says so, instead of following it forever", () => {
    const p = new Program([fakeDex([{ d: "La/A;", sup: "La/B;" }, { d: "La/B;", sup: "La/A;" }])]);
    expect(p.resolve("La/A;", "run()V")).toBeUndefined();
    expect(p.firstFramework("La/A;")).toBeUndefined();
    expect(p.problems.join("\n")).toMatch(/class hierarchy of a\.A loops/);
    expect(p.ancestors("La/A;")).toEqual(expect.arrayContaining(["La/A;", "La/B;"]));
  });

  it("takes a class that names itself as its superclass, or a missing superclass, without a hang", () => {
    const p = new Program([fakeDex([{ d: "La/Self;", sup: "La/Self;", interfaces: ["La/Self;"] }, { d: "La/Orphan;", sup: "La/Gone;" }])]);
    expect(p.resolve("La/Self;", "run()V")).toBeUndefined();
    // A superclass that is neither the app's nor in the framework table is taken as a framework class.
    expect(p.firstFramework("La/Orphan;")).toBe("La/Gone;");
    expect(p.frameworkFacing("La/Orphan;")).toBe(true);
    expect(reachability(p, [...p.classes.values()]).count).toBe(0);
  });
});
