/**
 * Which of the app's methods can run: a call graph built by class hierarchy analysis (Dean, Grove &
 * Chambers, ECOOP 1995: a virtual call may land on any override in a subclass of the named class) refined by
 * rapid type analysis (Bacon & Sweeney, OOPSLA 1996: only classes instantiated in reached code dispatch),
 * grown from the entry points the manifest declares. On Android the framework calls into the app, so:
 * - every class the manifest names (application, components, backup agent, component factory, instrumentation)
 *   and every View or Fragment subclass (inflated from resources by name) is instantiated by the framework;
 * - an instantiated class with a supertype outside the app (Activity, Runnable, a listener interface) has
 *   every virtual method it defines or inherits from the app reached: the framework may call any of them
 *   (this over-approximates: a method that overrides nothing is taken as a callback too);
 * - a static initialiser runs when its class is instantiated, its static members used, or named by reflection;
 * - a string constant that names an app class, in reached code, instantiates it (constant-string reflection),
 *   and other string constants of the same method name methods of those classes (getMethod("name")).
 */
import { ACC, InvokeKind, methodCode, javaName } from "../../extract/dex/dex.js";
import type { ClassNode, MethodNode, Program } from "./program.js";

/** Methods of java.lang.Object the runtime itself calls on any object (toString by string building, …). */
const OBJECT_CALLBACKS = ["toString()Ljava/lang/String;", "equals(Ljava/lang/Object;)Z", "hashCode()I", "finalize()V", "clone()Ljava/lang/Object;"];

/** Framework classes whose subclasses the platform creates by name from resources (layouts, fragments). */
const INFLATED = new Set(["Landroid/view/View;", "Landroid/app/Fragment;", "Landroidx/fragment/app/Fragment;", "Landroid/support/v4/app/Fragment;", "Landroidx/preference/Preference;", "Landroid/preference/Preference;"]);

const REFLECTION_BY_NAME = new Set(["Ljava/lang/Class;->forName", "Ljava/lang/ClassLoader;->loadClass", "Ljava/lang/Class;->getMethod", "Ljava/lang/Class;->getDeclaredMethod", "Ljava/lang/reflect/Method;->invoke"]);

export interface Reachability {
  /** Per method of the program: 1 when reached. */
  reached: Uint8Array;
  /** Classes instantiated in reached code or by the framework. */
  instantiated: ReadonlySet<string>;
  /** Per named class: the instantiated classes it may dispatch to (itself and its subtypes). */
  dispatch: ReadonlyMap<string, readonly ClassNode[]>;
  /** Reached methods that call reflection with no constant class name beside the call: "Lorg/…/X;->m". */
  nonConstantReflection: string[];
  /** How many methods were reached, of how many. */
  count: number;
}

/** Calls, instantiations and class initialisations of one method, each given to `edge` (the RTA's and the path search's shared walk). */
export interface Walk {
  program: Program;
  /** Named class → instantiated subtypes (grows during the analysis). */
  dispatch: Map<string, ClassNode[]>;
  edge(target: MethodNode): void;
  /** A virtual call of `sig` on `owner`: dispatched now over `dispatch`, and remembered by the analysis for classes instantiated later. */
  virtualCall?(owner: string, sig: string): void;
  instantiate(cls: ClassNode): void;
}

/** `<clinit>` of a class and its app superclasses. */
export function initialise(p: Program, cls: ClassNode, edge: (m: MethodNode) => void): void {
  let c: ClassNode | undefined = cls;
  for (let depth = 0; c && depth < 64; depth++) {
    const m = c.methods.get("<clinit>()V");
    if (m) edge(m);
    c = c.def.superclass ? p.classes.get(c.def.superclass) : undefined;
  }
}

/** The methods the framework may call on an instance of `cls`: see the module comment. */
export function callbacks(p: Program, cls: ClassNode, edge: (m: MethodNode) => void): void {
  if (!p.frameworkFacing(cls.descriptor)) {
    for (const sig of OBJECT_CALLBACKS) {
      const m = p.resolve(cls.descriptor, sig);
      if (m) edge(m);
    }
    return;
  }
  let c: ClassNode | undefined = cls;
  for (let depth = 0; c && depth < 64; depth++) {
    for (const m of c.methods.values()) {
      if (m.def.direct) continue;
      const target = c === cls ? m : p.resolve(cls.descriptor, m.sig);
      if (target) edge(target);
    }
    c = c.def.superclass ? p.classes.get(c.def.superclass) : undefined;
  }
}

/** Walks one method's code: the edges out of it. */
export function walkMethod(w: Walk, m: MethodNode): { reflects: boolean; constantNames: boolean } {
  const p = w.program;
  const dex = p.dexes[m.cls.dex];
  const code = methodCode(dex, m.def);
  let reflects = false;
  let constantNames = false;
  for (const packed of code.invokes) {
    const kind = packed & 7;
    const ref = p.ref(m.cls.dex, packed >>> 3);
    if (kind === InvokeKind.Static || kind === InvokeKind.Direct || kind === InvokeKind.Super) {
      const t = p.resolve(ref.owner, ref.sig);
      if (t) w.edge(t);
      if (kind === InvokeKind.Static) {
        const c = p.classes.get(ref.owner);
        if (c) initialise(p, c, w.edge);
      }
    } else if (w.virtualCall) w.virtualCall(ref.owner, ref.sig);
    else for (const c of w.dispatch.get(ref.owner) ?? []) {
      const t = p.resolve(c.descriptor, ref.sig);
      if (t) w.edge(t);
    }
    if (!reflects && (ref.owner === "Ljava/lang/Class;" || ref.owner === "Ljava/lang/ClassLoader;" || ref.owner === "Ljava/lang/reflect/Method;") && REFLECTION_BY_NAME.has(`${ref.owner}->${ref.name}`)) reflects = true;
  }
  for (const t of code.types) {
    const c = p.classes.get(dex.type(t));
    if (c) w.instantiate(c);
  }
  for (const f of code.fields) {
    const c = p.classes.get(dex.field(f).owner);
    if (c && c !== m.cls) initialise(p, c, w.edge);
  }
  if (code.strings.length) {
    // Constant-string reflection: names of app classes in this method, then method names on them.
    const named: ClassNode[] = [];
    const others: string[] = [];
    for (const s of code.strings) {
      const text = dex.string(s);
      const c = text.length < 512 && text.includes(".") ? p.byJavaName(text) : undefined;
      if (c) named.push(c);
      else if (text.length < 256) others.push(text);
      if (reflects && !constantNames && /^[A-Za-z_$][\w$]*(\.[A-Za-z_$][\w$]*)+$/.test(text)) constantNames = true;
    }
    for (const c of named) {
      w.instantiate(c);
      for (const mm of c.methods.values()) if (mm.name === "<init>" || others.includes(mm.name)) w.edge(mm);
    }
  }
  return { reflects, constantNames };
}

/** The classes the framework creates on its own: what the manifest names, and what resources inflate by name. */
export function entryClasses(p: Program, manifestClasses: readonly string[]): ClassNode[] {
  const out = new Set<ClassNode>();
  for (const name of manifestClasses) {
    const c = p.byJavaName(name);
    if (c) out.add(c);
  }
  for (const c of p.classes.values()) if (!(c.def.accessFlags & ACC.ABSTRACT) && p.ancestors(c.descriptor).some((a) => INFLATED.has(a))) out.add(c);
  return [...out];
}

export interface ReachOptions {
  /** Methods reached from the start besides the entry classes' (a test's `main`). */
  roots?: readonly MethodNode[];
  /**
   * Class hierarchy analysis alone: a virtual call dispatches to every class below the named one, created
   * or not (the coarser graph RTA refines; for comparison and tests).
   */
  cha?: boolean;
}

/** The rapid-type-analysis fixpoint from the entry classes. */
export function reachability(p: Program, entries: readonly ClassNode[], options: ReachOptions = {}): Reachability {
  const reached = new Uint8Array(p.methods.length);
  const queue: MethodNode[] = [];
  const instantiated = new Set<string>();
  const dispatch = new Map<string, ClassNode[]>();
  const callsOn = new Map<string, Set<string>>();
  const nonConstantReflection: string[] = [];
  let count = 0;
  const edge = (m: MethodNode) => {
    if (reached[m.id]) return;
    reached[m.id] = 1;
    count++;
    queue.push(m);
  };
  const instantiate = (c: ClassNode) => {
    if (instantiated.has(c.descriptor)) return;
    instantiated.add(c.descriptor);
    initialise(p, c, edge);
    for (const a of p.ancestors(c.descriptor)) {
      let list = dispatch.get(a);
      if (!list) dispatch.set(a, (list = []));
      list.push(c);
      for (const sig of callsOn.get(a) ?? []) {
        const t = p.resolve(c.descriptor, sig);
        if (t) edge(t);
      }
    }
    callbacks(p, c, edge);
  };
  const virtualCall = (owner: string, sig: string) => {
    let sigs = callsOn.get(owner);
    if (!sigs) callsOn.set(owner, (sigs = new Set()));
    if (sigs.has(sig)) return;
    sigs.add(sig);
    for (const c of dispatch.get(owner) ?? []) {
      const t = p.resolve(c.descriptor, sig);
      if (t) edge(t);
    }
  };
  const walk: Walk = { program: p, dispatch, edge, virtualCall, instantiate };
  if (options.cha) {
    for (const c of p.classes.values()) {
      if (c.def.accessFlags & (ACC.ABSTRACT | ACC.INTERFACE)) continue;
      for (const a of p.ancestors(c.descriptor)) {
        let list = dispatch.get(a);
        if (!list) dispatch.set(a, (list = []));
        list.push(c);
      }
    }
  }
  for (const m of options.roots ?? []) edge(m);
  for (const c of entries) instantiate(c);
  while (queue.length) {
    const m = queue.pop()!;
    const r = walkMethod(walk, m);
    if (r.reflects && !r.constantNames && nonConstantReflection.length < 50) nonConstantReflection.push(`${javaName(m.cls.descriptor)}.${m.name}`);
  }
  return { reached, instantiated, dispatch, nonConstantReflection, count };
}

/**
 * The shortest call path (fewest methods) from `from` to each method for which `wanted` says yes, over the
 * finished analysis: entry method first. Used for the re-delegation check's evidence paths.
 */
export function pathsFrom(p: Program, r: Reachability, from: readonly MethodNode[], wanted: (m: MethodNode) => boolean, limit = 200_000): Map<number, MethodNode[]> {
  const parent = new Map<number, number>();
  const out = new Map<number, MethodNode[]>();
  const queue: MethodNode[] = [];
  for (const m of from) if (!parent.has(m.id)) parent.set(m.id, -1), queue.push(m);
  const dispatch = r.dispatch as Map<string, ClassNode[]>;
  for (let head = 0; head < queue.length && head < limit; head++) {
    const m = queue[head];
    if (wanted(m)) {
      const path: MethodNode[] = [];
      for (let at = m.id; at !== -1; at = parent.get(at)!) path.unshift(p.methods[at]);
      out.set(m.id, path);
    }
    const edge = (t: MethodNode) => {
      if (parent.has(t.id)) return;
      parent.set(t.id, m.id);
      queue.push(t);
    };
    walkMethod({ program: p, dispatch, edge, instantiate: (c) => (initialise(p, c, edge), r.instantiated.has(c.descriptor) && callbacks(p, c, edge)) }, m);
  }
  return out;
}

