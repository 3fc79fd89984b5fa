/**
 * The app's code as one program: every class of every dex (the first definition of a class wins, as the
 * platform's class loader takes the first dex that defines it), each method keyed by its signature, and the
 * class hierarchy — the app's own superclass and interface chains, continued outside the app by the table
 * of framework superclasses (src/platform/data/framework-superclasses.tsv). A hierarchy that loops or runs
 * deeper than MAX_HIERARCHY_DEPTH is cut there and said in `problems`, never followed forever.
 */
import { ACC, javaName, type DexClass, type DexFile, type DexMethodDef } from "../../extract/dex/dex.js";
import { apiPermissionMap } from "../../platform/api-map.js";

/** Superclass links deeper than this are taken as a loop (real chains are a dozen deep). */
export const MAX_HIERARCHY_DEPTH = 256;

export interface MethodNode {
  /** Index into `Program.methods`. */
  id: number;
  cls: ClassNode;
  def: DexMethodDef;
  name: string;
  /** `name(params)returns` in descriptors: `onReceive(Landroid/content/Context;Landroid/content/Intent;)V`. */
  sig: string;
}

export interface ClassNode {
  descriptor: string;
  /** Which dex (index into `Program.dexes`) defines it. */
  dex: number;
  def: DexClass;
  methods: Map<string, MethodNode>;
}

/** A method reference as an instruction names it. */
export interface MethodRefInfo {
  owner: string;
  name: string;
  sig: string;
  params: string[];
  returns: string;
}

let frameworkSuperDescriptors: Map<string, string> | undefined;

/** `android.app.Service` → `Landroid/app/Service;`. */
export function descriptorOf(javaClass: string): string {
  return `L${javaClass.replace(/\./g, "/")};`;
}

function frameworkSupers(): Map<string, string> {
  if (!frameworkSuperDescriptors) {
    frameworkSuperDescriptors = new Map();
    for (const [cls, sup] of apiPermissionMap().frameworkSuper) frameworkSuperDescriptors.set(descriptorOf(cls), descriptorOf(sup));
  }
  return frameworkSuperDescriptors;
}

export const OBJECT = "Ljava/lang/Object;";

export class Program {
  readonly classes = new Map<string, ClassNode>();
  readonly methods: MethodNode[] = [];
  readonly problems: string[] = [];
  private readonly ancestorCache = new Map<string, readonly string[]>();
  private byJava?: Map<string, ClassNode>;
  private readonly reportedLoops = new Set<string>();

  constructor(readonly dexes: readonly DexFile[]) {
    dexes.forEach((dex, d) => {
      for (const def of dex.classes) {
        if (this.classes.has(def.descriptor)) continue;
        const node: ClassNode = { descriptor: def.descriptor, dex: d, def, methods: new Map() };
        this.classes.set(def.descriptor, node);
        for (const m of def.methods) {
          const ref = this.ref(d, m.id);
          const mn: MethodNode = { id: this.methods.length, cls: node, def: m, name: ref.name, sig: ref.sig };
          this.methods.push(mn);
          node.methods.set(ref.sig, mn);
        }
      }
    });
  }

  /** The method id `i` of dex `d`, with its signature key (the dex makes each once). */
  ref(d: number, i: number): MethodRefInfo {
    return this.dexes[d].method(i);
  }

  /** A class by its Java name (`org.example.app.Main`), for names in the manifest and in string constants. */
  byJavaName(name: string): ClassNode | undefined {
    if (!this.byJava) {
      this.byJava = new Map();
      for (const c of this.classes.values()) this.byJava.set(javaName(c.descriptor), c);
    }
    return this.byJava.get(name);
  }

  /** The superclass: the app's own class_def, else the framework table; undefined at the top or when unknown. */
  superOf(descriptor: string): string | undefined {
    const c = this.classes.get(descriptor);
    if (c) return c.def.superclass;
    return frameworkSupers().get(descriptor) ?? (descriptor === OBJECT ? undefined : OBJECT);
  }

  private loop(descriptor: string): void {
    if (this.reportedLoops.has(descriptor) || this.reportedLoops.size >= 10) return;
    this.reportedLoops.add(descriptor);
    this.problems.push(`the class hierarchy of ${javaName(descriptor)} loops or runs deeper than ${MAX_HIERARCHY_DEPTH} classes: cut there`);
  }

  /**
   * Where a call of `sig` on an object of class `descriptor` lands in the app's code: the nearest definition
   * up the superclass chain, else a default method of an interface; undefined when it lands in the framework.
   */
  resolve(descriptor: string, sig: string): MethodNode | undefined {
    let cur: string | undefined = descriptor;
    for (let depth = 0; cur; depth++) {
      if (depth > MAX_HIERARCHY_DEPTH) {
        this.loop(descriptor);
        return undefined;
      }
      const c = this.classes.get(cur);
      if (!c) break;
      const m = c.methods.get(sig);
      if (m) return m;
      cur = c.def.superclass;
    }
    // Java 8 default methods: the first interface (of the class or its superclasses) that defines it with code.
    for (const a of this.ancestors(descriptor)) {
      const c = this.classes.get(a);
      const m = c && c.def.accessFlags & ACC.INTERFACE ? c.methods.get(sig) : undefined;
      if (m && m.def.at >= 0) return m;
    }
    return undefined;
  }

  /** The first class outside the app on the superclass chain (the class itself when it is not the app's). */
  firstFramework(descriptor: string): string | undefined {
    let cur: string | undefined = descriptor;
    for (let depth = 0; cur && this.classes.has(cur); depth++) {
      if (depth > MAX_HIERARCHY_DEPTH) {
        this.loop(descriptor);
        return undefined;
      }
      cur = this.classes.get(cur)!.def.superclass;
    }
    return cur;
  }

  /** The class and every supertype (superclasses and interfaces, the app's and the framework's it knows), once each. */
  ancestors(descriptor: string): readonly string[] {
    const hit = this.ancestorCache.get(descriptor);
    if (hit) return hit;
    const out: string[] = [];
    const seen = new Set<string>();
    const stack = [descriptor];
    while (stack.length) {
      const d = stack.pop()!;
      if (seen.has(d)) continue;
      if (seen.size > 4 * MAX_HIERARCHY_DEPTH) {
        this.loop(descriptor);
        break;
      }
      seen.add(d);
      out.push(d);
      const c = this.classes.get(d);
      const sup = this.superOf(d);
      if (sup) stack.push(sup);
      if (c) for (const i of c.def.interfaces) stack.push(i);
    }
    this.ancestorCache.set(descriptor, out);
    return out;
  }

  /** Whether the framework may call into objects of this class: it has a supertype outside the app other than Object. */
  frameworkFacing(descriptor: string): boolean {
    return this.ancestors(descriptor).some((a) => a !== OBJECT && !this.classes.has(a));
  }
}
