/**
 * The program the call graph walks: classes of every dex, their methods by signature, and the hierarchy —
 * on the torch's real dex (fixtures/dex, assembled by Debian's smali) and on hand-made hierarchies that lie.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readDex, type DexClass, type DexFile } from "../../../src/extract/dex/dex.js";
import { Program } from "../../../src/score/code/program.js";
import { reachability } from "../../../src/score/code/reach.js";
import { FIXTURES } from "../../helpers/paths.js";

describe("the program of an app's dex files", () => {
  const p = new Program(["echomemo-classes", "echomemo-classes2"].map((n) => readDex(readFileSync(`${FIXTURES}dex/${n}.dex`))));

  it("keys each method by its signature and finds where a call lands up the hierarchy", () => {
    // RecordService does not define startForeground: the call lands in the framework (android.app.Service).
    expect(p.resolve("Lorg/example/echomemo/app/RecordService;", "startForeground(ILandroid/app/Notification;I)V")).toBeUndefined();
    expect(p.firstFramework("Lorg/example/echomemo/app/RecordService;")).toBe("Landroid/app/Service;");
    expect(p.resolve("Lorg/example/echomemo/app/RecordService;", "onBind(Landroid/content/Intent;)Landroid/os/IBinder;")?.cls.descriptor).toBe("Lorg/example/echomemo/app/RecordService;");
  });

  it("continues outside the app with the framework superclass table", () => {
    expect(p.ancestors("Lorg/example/echomemo/app/RecordService;")).toEqual(expect.arrayContaining(["Landroid/app/Service;", "Landroid/content/ContextWrapper;", "Landroid/content/Context;", "Ljava/lang/Object;"]));
    expect(p.frameworkFacing("Lorg/example/echomemo/app/MainActivity$1;")).toBe(true); // a View.OnClickListener
    expect(p.frameworkFacing("Lorg/example/compat/NetCompat;")).toBe(false);
    expect(p.byJavaName("org.example.echomemo.plugins.Exporter")?.dex).toBe(1);
  });
});

/** A dex of hand-made classes: just what the program reads. */
function fakeDex(classes: { d: string; sup?: string; interfaces?: string[] }[]): DexFile {
  const defs: DexClass[] = classes.map((c) => ({ descriptor: c.d, ...(c.sup ? { superclass: c.sup } : {}), interfaces: c.interfaces ?? [], accessFlags: 1, methods: [] }));
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
