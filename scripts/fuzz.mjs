#!/usr/bin/env node
// Mutation-based fuzzing of overask's readers: fixture APKs, bundles, binary and plain manifests,
// resources.arsc files, protobuf manifests and corpus files, mutated in the ways hostile files are made.
// Invariants: only overask's typed errors (InputError and its subclasses) escape; every input finishes in
// under 2 s; the process stays under 512 MB. An input that breaks one is minimized and saved in
// fixtures/crashers/, where test/robustness/crashers.test.ts replays it.
//
//   npm run fuzz -- --iterations 20000 --seed 1 [--save]
import { createHash } from "node:crypto";
import { mkdirSync, readFileSync, readdirSync, writeFileSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { Worker, isMainThread, parentPort, workerData } from "node:worker_threads";
import { deflateRawSync, inflateRawSync } from "node:zlib";

const ROOT = fileURLToPath(new URL("../", import.meta.url));
const LIMIT_MS = 2000;
const LIMIT_RSS_MB = 512;

// ---------------------------------------------------------------------------------------------
// Seeds and mutations (used by both threads; deterministic for a seed and an iteration number).

// The project's own seeded generator (mulberry32), from the build.
const { seededRandom: rng } = await import(new URL("../dist/util/random.js", import.meta.url).href);

function unzipEntry(zipBytes, name) {
  // Tiny reader for seeds only: find the entry in the central directory and inflate it.
  const b = Buffer.from(zipBytes);
  let e = b.length - 22;
  while (b.readUInt32LE(e) !== 0x06054b50) e--;
  let p = b.readUInt32LE(e + 16);
  const end = p + b.readUInt32LE(e + 12);
  while (p < end) {
    const n = b.readUInt16LE(p + 28);
    const entry = b.toString("utf8", p + 46, p + 46 + n);
    const method = b.readUInt16LE(p + 10);
    const csize = b.readUInt32LE(p + 20);
    const at = b.readUInt32LE(p + 42);
    if (entry === name) {
      const data = b.subarray(at + 30 + b.readUInt16LE(at + 26) + b.readUInt16LE(at + 28)), body = data.subarray(0, csize);
      return method === 8 ? inflateRawSync(body) : Buffer.from(body);
    }
    p += 46 + n + b.readUInt16LE(p + 30) + b.readUInt16LE(p + 32);
  }
  return undefined;
}

function loadSeeds() {
  const seeds = [];
  const add = (kind, name, bytes) => bytes && seeds.push({ kind, name, bytes: new Uint8Array(bytes) });
  for (const f of readdirSync(join(ROOT, "fixtures/apk"))) {
    const apk = readFileSync(join(ROOT, "fixtures/apk", f));
    add("file", `apk/${f}`, apk);
    add("file", `manifest/${f}`, unzipEntry(apk, "AndroidManifest.xml"));
    add("arsc", `arsc/${f}`, unzipEntry(apk, "resources.arsc"));
  }
  for (const f of readdirSync(join(ROOT, "fixtures/bundle"))) add("file", `bundle/${f}`, readFileSync(join(ROOT, "fixtures/bundle", f)));
  add("file", "platform/framework-manifest", readFileSync(join(ROOT, "fixtures/platform/framework-res-AndroidManifest.xml")));
  for (const d of readdirSync(join(ROOT, "fixtures/apps"))) {
    try {
      add("file", `plain/${d}`, readFileSync(join(ROOT, "fixtures/apps", d, "AndroidManifest.xml")));
    } catch {
      /* not an app folder */
    }
  }
  for (const f of readdirSync(join(ROOT, "fixtures/dex"))) add("dex", `dex/${f}`, readFileSync(join(ROOT, "fixtures/dex", f)));
  const corpus = readFileSync(join(ROOT, "fixtures/corpus/harbourview.jsonl"), "utf8").split("\n").slice(0, 40).join("\n");
  add("jsonl", "corpus/harbourview-40.jsonl", Buffer.from(corpus));
  add("csv", "corpus/wide.csv", Buffer.from("SEND_SMS,CAMERA,READ_SMS,class\n1,0,1,S\n0,1,0,B\n0,0,0,B\n1,1,1,S\n"));
  return seeds;
}

/** Offsets of chunk headers in Android binary XML / resource tables (for boundary-aware mutations). */
function chunkOffsets(b) {
  const out = [];
  if (b.length < 8 || !(b[0] === 3 || b[0] === 2)) return out;
  const view = new DataView(b.buffer, b.byteOffset, b.byteLength);
  const walk = (start, end, depth) => {
    let p = start;
    for (let guard = 0; p + 8 <= end && guard < 100000; guard++) {
      const size = view.getUint32(p + 4, true);
      const headerSize = view.getUint16(p + 2, true);
      out.push(p);
      if (size < 8 || p + size > end) break;
      if (depth < 2 && view.getUint16(p, true) === 0x0200) walk(p + headerSize, p + size, depth + 1); // package chunks
      p += size;
    }
  };
  walk(view.getUint16(2, true), Math.min(b.length, view.getUint32(4, true)), 0);
  return out;
}

function zipRecords(b) {
  const view = Buffer.from(b.buffer, b.byteOffset, b.byteLength);
  let e = view.length - 22;
  while (e >= 0 && view.readUInt32LE(e) !== 0x06054b50) e--;
  if (e < 0) return undefined;
  const cd = view.readUInt32LE(e + 16);
  const central = [];
  for (let p = cd; p + 46 <= e && view.readUInt32LE(p) === 0x02014b50; p += 46 + view.readUInt16LE(p + 28) + view.readUInt16LE(p + 30) + view.readUInt16LE(p + 32)) central.push(p);
  return { eocd: e, cd, central };
}

// Deflated runs of zeros (20, 40 and 60 MB), made once: deflating them anew each time would dominate.
const BOMBS = [20, 40, 60].map((mb) => deflateRawSync(Buffer.alloc(mb * 1024 * 1024)));

const MUTATORS = [
  function bitFlips(b, r) {
    const out = Uint8Array.from(b);
    for (let k = 1 + Math.floor(r() * 8); k > 0; k--) out[Math.floor(r() * out.length)] ^= 1 << Math.floor(r() * 8);
    return out;
  },
  function insertBytes(b, r) {
    const at = Math.floor(r() * (b.length + 1));
    const extra = Uint8Array.from({ length: 1 + Math.floor(r() * 64) }, () => Math.floor(r() * 256));
    return Uint8Array.from([...b.subarray(0, at), ...extra, ...b.subarray(at)]);
  },
  function deleteBytes(b, r) {
    const at = Math.floor(r() * b.length);
    const n = 1 + Math.floor(r() * Math.min(256, b.length - at));
    return Uint8Array.from([...b.subarray(0, at), ...b.subarray(at + n)]);
  },
  function truncate(b, r) {
    const cuts = chunkOffsets(b);
    const at = cuts.length && r() < 0.7 ? cuts[Math.floor(r() * cuts.length)] + Math.floor(r() * 12) - 4 : Math.floor(r() * b.length);
    return b.subarray(0, Math.max(0, Math.min(b.length, at)));
  },
  function lyingChunkSize(b, r) {
    const cuts = chunkOffsets(b);
    if (!cuts.length) return null;
    const out = Uint8Array.from(b);
    const v = new DataView(out.buffer);
    const p = cuts[Math.floor(r() * cuts.length)];
    const choice = Math.floor(r() * 4);
    if (choice === 0) v.setUint32(p + 4, Math.floor(r() * 0xffffffff), true);
    else if (choice === 1) v.setUint32(p + 4, Math.floor(r() * 16), true);
    else if (choice === 2) v.setUint16(p + 2, Math.floor(r() * 0xffff), true); // header size
    else v.setUint16(p, Math.floor(r() * 0x300), true); // chunk type
    return out;
  },
  function lyingCounts(b, r) {
    const cuts = chunkOffsets(b);
    if (!cuts.length) return null;
    const out = Uint8Array.from(b);
    const v = new DataView(out.buffer);
    const p = cuts[Math.floor(r() * cuts.length)];
    if (p + 28 > out.length) return null;
    // String pool: stringCount, styleCount, stringsStart; element: attributeStart/Size/Count; type: entryCount.
    const field = [8, 12, 20, 24, 16 + 8, 16 + 10, 16 + 12][Math.floor(r() * 7)];
    const values = [0xffffffff, 0x7fffffff, 9_000_000, 65535, Math.floor(r() * 1000)];
    if (p + field + 4 <= out.length) v.setUint32(p + field, values[Math.floor(r() * values.length)], true);
    return out;
  },
  function lyingOffsets(b, r) {
    // String offsets right after a string pool header point anywhere.
    const cuts = chunkOffsets(b).filter((p) => p + 28 < b.length && b[p] === 1 && b[p + 1] === 0);
    if (!cuts.length) return null;
    const out = Uint8Array.from(b);
    const v = new DataView(out.buffer);
    const p = cuts[Math.floor(r() * cuts.length)];
    const headerSize = v.getUint16(p + 2, true);
    const count = Math.min(v.getUint32(p + 8, true), 64);
    for (let k = 0; k < 4 && count; k++) {
      const at = p + headerSize + 4 * Math.floor(r() * count);
      if (at + 4 <= out.length) v.setUint32(at, r() < 0.5 ? 0xfffffff0 : Math.floor(r() * 1e6), true);
    }
    return out;
  },
  function deepNesting(b, r, kind) {
    if (kind === "jsonl" || kind === "csv") return null;
    const depth = 200 + Math.floor(r() * 5000);
    return new TextEncoder().encode(`<manifest package="org.example.deep">${"<a>".repeat(depth)}${"</a>".repeat(depth)}</manifest>`);
  },
  function longNames(b, r, kind) {
    const n = 1000 + Math.floor(r() * 100_000);
    if (kind === "jsonl") return new TextEncoder().encode(`{"id":"${"x".repeat(n)}","category":"Tools","permissions":["${"P".repeat(n)}"]}\n`);
    return new TextEncoder().encode(`<manifest xmlns:android="http://schemas.android.com/apk/res/android" package="org.example.long"><uses-permission android:name="${"A".repeat(n)}" ${"b".repeat(Math.min(n, 10000))}="1"/></manifest>`);
  },
  function duplicateEntry(b) {
    const z = zipRecords(b);
    if (!z || !z.central.length) return null;
    const buf = Buffer.from(b);
    const first = z.central[0];
    const len = 46 + buf.readUInt16LE(first + 28) + buf.readUInt16LE(first + 30) + buf.readUInt16LE(first + 32);
    const rec = buf.subarray(first, first + len);
    const out = Buffer.concat([buf.subarray(0, z.eocd), rec, buf.subarray(z.eocd)]);
    const e = z.eocd + len;
    out.writeUInt16LE(out.readUInt16LE(e + 8) + 1, e + 8);
    out.writeUInt16LE(out.readUInt16LE(e + 10) + 1, e + 10);
    out.writeUInt32LE(out.readUInt32LE(e + 12) + len, e + 12);
    return new Uint8Array(out);
  },
  function lyingZipFields(b, r) {
    const z = zipRecords(b);
    if (!z || !z.central.length) return null;
    const out = Buffer.from(b);
    const p = z.central[Math.floor(r() * z.central.length)];
    // compressed size, uncompressed size, local header offset, method, flags, name length
    const fields = [[20, 4], [24, 4], [42, 4], [10, 2], [8, 2], [28, 2]];
    const [off, size] = fields[Math.floor(r() * fields.length)];
    const val = [0, 1, 0xffff, 0xffffffff, Math.floor(r() * 100000)][Math.floor(r() * 5)];
    if (size === 4) out.writeUInt32LE(val >>> 0, p + off);
    else out.writeUInt16LE(val & 0xffff, p + off);
    return new Uint8Array(out);
  },
  function inflatesPastDeclared(b) {
    const z = zipRecords(b);
    if (!z) return null;
    const out = Buffer.from(b);
    for (const p of z.central) out.writeUInt32LE(16, p + 24); // declared uncompressed size
    return new Uint8Array(out);
  },
  function zipBomb(b, r) {
    // An honest bomb: a small zip whose manifest inflates to tens of megabytes.
    const body = BOMBS[Math.floor(r() * BOMBS.length)];
    const name = Buffer.from("AndroidManifest.xml");
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0); local.writeUInt16LE(8, 8); local.writeUInt32LE(body.length, 18); local.writeUInt32LE(0x7fffffff, 22); local.writeUInt16LE(name.length, 26);
    const cen = Buffer.alloc(46);
    cen.writeUInt32LE(0x02014b50, 0); cen.writeUInt16LE(8, 10); cen.writeUInt32LE(body.length, 20); cen.writeUInt32LE(r() < 0.5 ? 4096 : 60 * 1024 * 1024, 24); cen.writeUInt16LE(name.length, 28);
    const cdAt = 30 + name.length + body.length;
    const eocd = Buffer.alloc(22);
    eocd.writeUInt32LE(0x06054b50, 0); eocd.writeUInt16LE(1, 8); eocd.writeUInt16LE(1, 10); eocd.writeUInt32LE(46 + name.length, 12); eocd.writeUInt32LE(cdAt, 16);
    return new Uint8Array(Buffer.concat([local, name, body, cen, name, eocd]));
  },
];

export function makeInput(seeds, seed, i) {
  const r = rng((seed * 1_000_003 + i) >>> 0);
  for (let attempt = 0; attempt < 8; attempt++) {
    const s = seeds[Math.floor(r() * seeds.length)];
    const m = MUTATORS[Math.floor(r() * MUTATORS.length)];
    let out = m(s.bytes, r, s.kind);
    if (!out) continue;
    // Sometimes stack a second mutation.
    if (r() < 0.3) {
      const m2 = MUTATORS[Math.floor(r() * 7)];
      out = m2(out, r, s.kind) ?? out;
    }
    const kind = m.name === "deepNesting" || m.name === "longNames" || m.name === "zipBomb" ? (s.kind === "jsonl" ? "jsonl" : "file") : s.kind;
    return { kind, seed: s.name, mutator: m.name, bytes: out };
  }
  return { kind: "file", seed: "none", mutator: "none", bytes: new Uint8Array(0) };
}

// ---------------------------------------------------------------------------------------------
// The worker: runs inputs through the readers and reports anything that is not a typed error.

const DEX_MANIFESTS = {};
async function runOne(lib, input, tmp) {
  switch (input.kind) {
    case "file": {
      const m = lib.readManifestBytes(input.bytes, "fuzz");
      lib.requestedPermissionNames(m);
      return;
    }
    case "dex": {
      // The reader, then the evidence stage over what it read — class hierarchy, call graph from the
      // manifest's entry points, component paths (strings are decoded on demand there).
      const dex = lib.readDex(input.bytes);
      const app = input.name?.includes("echomemo") ? "echomemo" : "beamtorch";
      const manifest = (DEX_MANIFESTS[app] ??= lib.readManifestBytes(readFileSync(join(ROOT, `fixtures/apps/${app}/AndroidManifest.xml`))));
      lib.codeEvidence(manifest, [{ entry: "classes.dex", dex }]);
      return;
    }
    case "arsc": {
      const t = new lib.ResourceTable(input.bytes);
      t.resolve(0x7f010000);
      t.resolve(0x7f020000);
      return;
    }
    case "jsonl":
    case "csv": {
      const path = join(tmp, `corpus.${input.kind}`);
      writeFileSync(path, input.bytes);
      const c = lib.openCorpusFile(path, { format: input.kind === "csv" ? "wide-csv" : "jsonl", labelField: input.kind === "csv" ? "class" : "label" });
      for await (const _ of c.records);
      return;
    }
  }
}

if (!isMainThread) {
  const lib = await import(join(ROOT, "dist/index.js"));
  const seeds = loadSeeds();
  const tmp = mkdtempSync(join(tmpdir(), "overask-fuzz-"));
  const { seed, from, to, crashers } = workerData;
  for (let i = from; i < to; i++) {
    // Replaying kept crashers, or a generated input.
    const input = crashers
      ? { kind: crashers[i].kind, seed: crashers[i].name, mutator: "crasher", bytes: readFileSync(join(ROOT, "fixtures/crashers", `${crashers[i].name}.bin`)) }
      : makeInput(seeds, seed, i);
    parentPort.postMessage({ type: "start", i, at: Date.now() });
    let problem;
    try {
      await runOne(lib, input, tmp);
    } catch (e) {
      if (!(e instanceof lib.InputError)) problem = `${e?.name ?? typeof e}: ${e?.message ?? String(e)}`.split("\n")[0];
    }
    const rss = process.memoryUsage().rss / 1024 / 1024;
    if (rss > LIMIT_RSS_MB) problem = `RSS ${rss.toFixed(0)} MB over ${LIMIT_RSS_MB} MB`;
    parentPort.postMessage({ type: "done", i, problem, mutator: input.mutator, seedName: input.seed, kind: input.kind });
  }
  parentPort.postMessage({ type: "end" });
}

// ---------------------------------------------------------------------------------------------
// The main thread: a watchdog over the worker, minimization and the report.

if (isMainThread && process.argv[1] === fileURLToPath(import.meta.url)) {
  const args = process.argv.slice(2);
  const opt = (k, d) => (args.includes(`--${k}`) ? args[args.indexOf(`--${k}`) + 1] : d);
  const iterations = Number(opt("iterations", "20000"));
  const seed = Number(opt("seed", "1"));
  const save = args.includes("--save");
  const seeds = loadSeeds();
  const lib = await import(join(ROOT, "dist/index.js"));
  const started = Date.now();
  const problems = [];
  let peakRss = 0;
  const byMutator = {};

  // First the inputs that once broke an invariant (fixtures/crashers/), each under the same watchdog:
  // a typed error or a result within LIMIT_MS.
  const crashers = JSON.parse(readFileSync(join(ROOT, "fixtures/crashers/index.json"), "utf8"));
  const crasherProblems = [];
  await watch({ seed, crashers }, crashers.length, crasherProblems, {});
  for (const p of crasherProblems) console.log(`fuzz: kept crasher ${crashers[p.i].name} breaks an invariant again: ${p.problem}`);
  console.log(`fuzz: replayed ${crashers.length} kept crashers under the ${LIMIT_MS} ms watchdog; ${crasherProblems.length} broke an invariant`);

  await watch({ seed }, iterations, problems, byMutator);
  const seconds = (Date.now() - started) / 1000;

  /** Runs inputs 0..count−1 on a worker; a hang past LIMIT_MS or a dead worker is a problem, and the run goes on after it. */
  async function watch(data, count, problems, byMutator) {
    let next = 0;
    while (next < count) {
      const from = next;
      await new Promise((resolve) => {
        const w = new Worker(fileURLToPath(import.meta.url), { workerData: { ...data, from, to: count } });
        let current = { i: from, at: Date.now() };
        const timer = setInterval(() => {
          peakRss = Math.max(peakRss, process.memoryUsage().rss / 1024 / 1024);
          if (Date.now() - current.at > LIMIT_MS) {
            problems.push({ i: current.i, problem: `hang: no result after ${LIMIT_MS} ms` });
            next = current.i + 1;
            clearInterval(timer);
            void w.terminate().then(resolve);
          }
        }, 100);
        w.on("message", (m) => {
          if (m.type === "start") current = m;
          else if (m.type === "done") {
            byMutator[m.mutator] = (byMutator[m.mutator] ?? 0) + 1;
            if (m.problem) problems.push({ i: m.i, problem: m.problem });
            next = m.i + 1;
          } else if (m.type === "end") {
            next = count;
            clearInterval(timer);
            void w.terminate().then(resolve);
          }
        });
        w.on("error", (e) => {
          problems.push({ i: current.i, problem: `worker died: ${e.message}` });
          next = current.i + 1;
          clearInterval(timer);
          resolve();
        });
      });
    }
  }

  // Minimize and keep what broke an invariant.
  const saved = [];
  for (const p of problems) {
    const input = makeInput(seeds, seed, p.i);
    let bytes = input.bytes;
    const stillBreaks = async (candidate) => {
      try {
        const t = Date.now();
        await runOne(lib, { ...input, bytes: candidate }, mkdtempSync(join(tmpdir(), "overask-min-")));
        return Date.now() - t > LIMIT_MS;
      } catch (e) {
        return !(e instanceof lib.InputError);
      }
    };
    if (!p.problem.startsWith("hang") && !p.problem.startsWith("RSS")) {
      for (let chunk = Math.floor(bytes.length / 2); chunk >= 1 && bytes.length > 1; chunk = Math.floor(chunk / 2)) {
        for (let at = 0; at + chunk <= bytes.length; ) {
          const candidate = Uint8Array.from([...bytes.subarray(0, at), ...bytes.subarray(at + chunk)]);
          if (await stillBreaks(candidate)) bytes = candidate;
          else at += chunk;
        }
      }
    }
    const hash = createHash("sha256").update(bytes).digest("hex").slice(0, 12);
    const name = `${input.kind}-${input.mutator}-${hash}`;
    saved.push({ name, kind: input.kind, mutator: input.mutator, seed: input.seed, iteration: p.i, problem: p.problem, bytes: bytes.length });
    if (save) {
      mkdirSync(join(ROOT, "fixtures/crashers"), { recursive: true });
      writeFileSync(join(ROOT, "fixtures/crashers", `${name}.bin`), bytes);
    }
  }
  if (save && saved.length) {
    const indexPath = join(ROOT, "fixtures/crashers/index.json");
    let index = [];
    try { index = JSON.parse(readFileSync(indexPath, "utf8")); } catch { /* first one */ }
    for (const s of saved) if (!index.some((x) => x.name === s.name)) index.push({ name: s.name, kind: s.kind, found: `seed ${seed}, iteration ${s.iteration}, ${s.mutator} of ${s.seed}`, problem: s.problem });
    writeFileSync(indexPath, `${JSON.stringify(index, null, 2)}\n`);
  }
  console.log(`fuzz: ${iterations} iterations (seed ${seed}) in ${seconds.toFixed(1)} s = ${Math.round(iterations / seconds)}/s; ${problems.length} broke an invariant; peak RSS ${peakRss.toFixed(0)} MB (limit ${LIMIT_RSS_MB})`);
  console.log(`  by mutation: ${Object.entries(byMutator).sort().map(([k, v]) => `${k} ${v}`).join(", ")}`);
  for (const s of saved.slice(0, 20)) console.log(`  ${s.problem} — ${s.mutator} of ${s.seed} (iteration ${s.iteration}, ${s.bytes} bytes after minimizing)${save ? ` → fixtures/crashers/${s.name}.bin` : ""}`);
  process.exitCode = problems.length || crasherProblems.length ? 1 : 0;
}
