#!/usr/bin/env node
// overask benchmarks. Figures on shared machines are noisy: every figure is reported next to a floor
// measured in the same run, and as a ratio to it. Run with `npm run bench` (builds first).
//
//   node scripts/bench.mjs [--only extract] [--sizes 5,50,200] [--reps 15]
//   node scripts/bench.mjs --only sweep [--sweep-sets typo,small,code,large] [--sweep-typo 3000]
import { execFileSync, spawn, spawnSync } from "node:child_process";
import { closeSync, copyFileSync, existsSync, fstatSync, mkdirSync, openSync, readFileSync, readSync, readdirSync, rmSync, statSync, writeFileSync, openSync as open2, writeSync } from "node:fs";
import { randomBytes } from "node:crypto";
import { join } from "node:path";
import { inflateRawSync, deflateRawSync, crc32 } from "node:zlib";
import { fileURLToPath } from "node:url";

const ROOT = fileURLToPath(new URL("../", import.meta.url));
const lib = await import(join(ROOT, "dist/index.js"));
const args = process.argv.slice(2);
const opt = (name, dflt) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : dflt;
};
const SIZES = opt("sizes", "5,50,200").split(",").map(Number);
const REPS = Number(opt("reps", "41"));
const OUT = join(ROOT, "bench-out");
mkdirSync(OUT, { recursive: true });

const ONLY = opt("only", "extract,learn,check,sweep,queue,code").split(",");
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const ms = (t0) => Number(process.hrtime.bigint() - t0) / 1e6;
const fmt = (x) => (x < 10 ? x.toFixed(3) : x.toFixed(1));

function header(title) {
  console.log(`\n## ${title}`);
}

/** Writes a zip: the manifest (deflated) first, then `mb` MB of random bytes in 1 MB stored entries. */
function writeSyntheticApk(path, mb, manifest, extra = []) {
  const fd = open2(path, "w");
  const central = [];
  let offset = 0;
  const put = (buf) => {
    writeSync(fd, buf);
    offset += buf.length;
  };
  const entry = (name, data, deflate) => {
    const body = deflate ? deflateRawSync(data) : data;
    const nameBuf = Buffer.from(name);
    const crc = crc32(data) >>> 0;
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(deflate ? 8 : 0, 8);
    local.writeUInt32LE(crc, 14);
    local.writeUInt32LE(body.length, 18);
    local.writeUInt32LE(data.length, 22);
    local.writeUInt16LE(nameBuf.length, 26);
    const at = offset;
    put(local);
    put(nameBuf);
    put(body);
    const cen = Buffer.alloc(46);
    cen.writeUInt32LE(0x02014b50, 0);
    cen.writeUInt16LE(20, 4);
    cen.writeUInt16LE(20, 6);
    cen.writeUInt16LE(deflate ? 8 : 0, 10);
    cen.writeUInt32LE(crc, 16);
    cen.writeUInt32LE(body.length, 20);
    cen.writeUInt32LE(data.length, 24);
    cen.writeUInt16LE(nameBuf.length, 28);
    cen.writeUInt32LE(at, 42);
    central.push(Buffer.concat([cen, nameBuf]));
  };
  entry("AndroidManifest.xml", manifest, true);
  for (const [name, data] of extra) entry(name, data, true);
  for (let i = 0; i < mb; i++) entry(`assets/blob${String(i).padStart(4, "0")}.bin`, randomBytes(1024 * 1024), false);
  const cd = Buffer.concat(central);
  const cdAt = offset;
  put(cd);
  const eocd = Buffer.alloc(22);
  eocd.writeUInt32LE(0x06054b50, 0);
  eocd.writeUInt16LE(central.length, 8);
  eocd.writeUInt16LE(central.length, 10);
  eocd.writeUInt32LE(cd.length, 12);
  eocd.writeUInt32LE(cdAt, 16);
  put(eocd);
  closeSync(fd);
}

/** The floor: end record, central directory, the manifest entry's local header and data, inflate. */
// (Also the floor of the sweep benchmark.)
function floorRead(path) {
  const fd = openSync(path, "r");
  const size = fstatSync(fd).size;
  const tailLen = Math.min(size, 22 + 0xffff);
  const tail = Buffer.alloc(tailLen);
  readSync(fd, tail, 0, tailLen, size - tailLen);
  let e = tailLen - 22;
  while (e >= 0 && tail.readUInt32LE(e) !== 0x06054b50) e--;
  const cdSize = tail.readUInt32LE(e + 12);
  const cdAt = tail.readUInt32LE(e + 16);
  const cd = Buffer.alloc(cdSize);
  readSync(fd, cd, 0, cdSize, cdAt);
  let p = 0;
  let data;
  while (p < cdSize) {
    const nameLen = cd.readUInt16LE(p + 28);
    const extraLen = cd.readUInt16LE(p + 30);
    const commentLen = cd.readUInt16LE(p + 32);
    const name = cd.toString("latin1", p + 46, p + 46 + nameLen);
    if (name === "AndroidManifest.xml") {
      const csize = cd.readUInt32LE(p + 20);
      const at = cd.readUInt32LE(p + 42);
      const lh = Buffer.alloc(30);
      readSync(fd, lh, 0, 30, at);
      const body = Buffer.alloc(csize);
      readSync(fd, body, 0, csize, at + 30 + lh.readUInt16LE(26) + lh.readUInt16LE(28));
      data = inflateRawSync(body);
      break;
    }
    p += 46 + nameLen + extraLen + commentLen;
  }
  closeSync(fd);
  return data;
}

// ---------------------------------------------------------------------------------------------
if (ONLY.includes("extract")) {
header("decode: the platform's framework manifest (222 KB, UTF-16), in process");
{
  const bytes = readFileSync(join(ROOT, "fixtures/platform/framework-res-AndroidManifest.xml"));
  for (let i = 0; i < 50; i++) lib.readManifestBytes(bytes); // warm-up
  const tree = [];
  const model = [];
  for (let i = 0; i < 200; i++) {
    let t = process.hrtime.bigint();
    lib.decodeBinaryXml(bytes);
    tree.push(ms(t));
    t = process.hrtime.bigint();
    lib.readManifestBytes(bytes);
    model.push(ms(t));
  }
  // Floor: touching every byte once (a sum over the buffer), the least any decoder must do.
  const floor = [];
  for (let i = 0; i < 200; i++) {
    const t = process.hrtime.bigint();
    let s = 0;
    for (let j = 0; j < bytes.length; j++) s = (s + bytes[j]) | 0;
    if (s === 42) console.log("");
    floor.push(ms(t));
  }
  console.log(`decodeBinaryXml (tree only):     median ${fmt(median(tree))} ms  (goal < 5 ms)`);
  console.log(`readManifestBytes (full model):  median ${fmt(median(model))} ms`);
  console.log(`floor (one pass over the bytes): median ${fmt(median(floor))} ms`);
}

// ---------------------------------------------------------------------------------------------
header("facts on synthetic APKs: a small manifest plus large incompressible entries");

function rss() {
  return process.memoryUsage().rss / 1024 / 1024;
}

{
  const manifest = lib.openArchiveFile(join(ROOT, "fixtures/apk/tidewatch.apk")).read("AndroidManifest.xml", "MAX_MANIFEST_BYTES");
  console.log("size     floor (ms)  archive layer (ms)  ratio   facts in-process (ms)  ratio   whole process (ms)  process floor (ms)");
  for (const mb of SIZES) {
    const path = join(OUT, `synthetic-${mb}mb.apk`);
    if (!existsSync(path)) writeSyntheticApk(path, mb, Buffer.from(manifest));
    // Warm both paths and the page cache.
    for (let i = 0; i < 3; i++) {
      floorRead(path);
      lib.readManifestFile(path);
    }
    const floor = [];
    const archive = [];
    const facts = [];
    // Each sample times a batch of calls: single calls take a fraction of a millisecond, below the
    // machine's timing noise.
    const BATCH = 50;
    for (let i = 0; i < REPS; i++) {
      let t = process.hrtime.bigint();
      for (let b = 0; b < BATCH; b++) floorRead(path);
      floor.push(ms(t) / BATCH);
      // The archive layer alone does what the floor does: directory, manifest entry, inflate (plus CRC).
      t = process.hrtime.bigint();
      for (let b = 0; b < BATCH; b++) {
        const a = lib.openArchiveFile(path, ["AndroidManifest.xml", "resources.arsc"]);
        a.read("AndroidManifest.xml", "MAX_MANIFEST_BYTES");
        a.close();
      }
      archive.push(ms(t) / BATCH);
      t = process.hrtime.bigint();
      for (let b = 0; b < BATCH; b++) lib.readManifestFile(path);
      facts.push(ms(t) / BATCH);
    }
    // Whole process: the CLI against `node -e` that runs the floor code (start-up cost alike).
    const proc = [];
    const procFloor = [];
    for (let i = 0; i < 5; i++) {
      let t = process.hrtime.bigint();
      execFileSync(process.execPath, [join(ROOT, "bin/overask.js"), "facts", "--format", "json", path], { stdio: "ignore" });
      proc.push(ms(t));
      t = process.hrtime.bigint();
      execFileSync(process.execPath, ["-e", `require("node:fs").readFileSync(${JSON.stringify(path)}, { flag: "r" }).subarray(0, 0)`.replace(/readFileSync\(.*\)/, "statSync(" + JSON.stringify(path) + ")")], { stdio: "ignore" });
      procFloor.push(ms(t));
    }
    const f = median(floor);
    const y = median(archive);
    const x = median(facts);
    console.log(
      `${String(mb).padStart(4)} MB  ${fmt(f).padStart(10)}  ${fmt(y).padStart(18)}  ${(y / f).toFixed(2).padStart(5)}x  ${fmt(x).padStart(21)}  ${(x / f).toFixed(2).padStart(5)}x  ${fmt(median(proc)).padStart(18)}  ${fmt(median(procFloor)).padStart(18)}`,
    );
  }
  console.log(`peak RSS of this benchmark process: ${rss().toFixed(0)} MB (includes the synthetic files' generation)`);
  console.log("facts in-process = archive layer + decoding the manifest and building the model (which the floor does not do)");
  console.log("goal: facts within 1.5x of the floor at 200 MB");
}
}

// ---------------------------------------------------------------------------------------------
if (ONLY.includes("learn")) {
  const ROWS = Number(opt("learn-rows", "1000000"));
  header(`learn: ${ROWS.toLocaleString("en")} synthetic JSONL records`);
  const path = join(OUT, `corpus-${ROWS}.jsonl`);
  if (!existsSync(path)) {
    const fd = open2(path, "w");
    const perms = [...lib.platformPermissions().keys()].filter((p) => p.startsWith("android.permission.")).slice(0, 300);
    const cats = ["Tools", "Communication", "Education", "Social", "Games", "Weather", "Finance", "Health"];
    let x = 12345;
    const rnd = () => ((x = (Math.imul(x, 1103515245) + 12345) >>> 0) / 4294967296);
    let buf = "";
    for (let i = 0; i < ROWS; i++) {
      const k = 3 + Math.floor(rnd() * 15);
      const set = new Set();
      for (let j = 0; j < k; j++) set.add(perms[Math.floor(rnd() * rnd() * perms.length)]);
      buf += `${JSON.stringify({ id: `org.example.bench${i}`, category: cats[Math.floor(rnd() * cats.length)], permissions: [...set], label: rnd() < 0.2 + 0.02 * k ? 1 : 0 })}\n`;
      if (buf.length > 1 << 20) { writeSync(fd, buf); buf = ""; }
    }
    writeSync(fd, buf);
    closeSync(fd);
  }
  const timed = (args) => {
    const t = process.hrtime.bigint();
    const r = spawnSync("/usr/bin/time", ["-f", "%M", ...args], { encoding: "utf8", stdio: ["ignore", "ignore", "pipe"] });
    if (r.status !== 0) throw new Error(`${args.join(" ")} failed: ${r.stderr}`);
    return { seconds: ms(t) / 1000, rssMb: Number(r.stderr.trim().split("\n").pop()) / 1024 };
  };
  // Floor: the same file read line by line and parsed, nothing counted.
  const floor = timed([process.execPath, "-e", `const rl=require("readline").createInterface({input:require("fs").createReadStream(${JSON.stringify(path)},{highWaterMark:1<<20}),crlfDelay:Infinity});let n=0;rl.on("line",l=>{if(l)JSON.parse(l),n++});`]);
  const noModel = timed([process.execPath, join(ROOT, "bin/overask.js"), "learn", path, "--label-field", "none", "-o", join(OUT, "bench-baseline.json")]);
  // The model trains on every labeled row up to --max-train-rows; a million synthetic rows are sampled to 20,000.
  const withModel = timed([process.execPath, join(ROOT, "bin/overask.js"), "learn", path, "--max-train-rows", "20000", "-o", join(OUT, "bench-baseline-model.json")]);
  const sample = JSON.parse(readFileSync(join(OUT, "bench-baseline-model.json"), "utf8")).model?.sample;
  console.log(`floor (read + JSON.parse every line): ${floor.seconds.toFixed(1)} s, peak RSS ${floor.rssMb.toFixed(0)} MB`);
  console.log(`learn without a model:                ${noModel.seconds.toFixed(1)} s (${(noModel.seconds / floor.seconds).toFixed(2)}x the floor), peak RSS ${noModel.rssMb.toFixed(0)} MB  (goal < 60 s, < 1 GB)`);
  console.log(`learn with the model:                 ${withModel.seconds.toFixed(1)} s, peak RSS ${withModel.rssMb.toFixed(0)} MB, trained on ${sample ? `a sample of ${sample.taken} of ${sample.of}` : "all"} labeled rows`);
  // The bundled default baseline, as baselines/README.md rebuilds it (all 15,036 labeled rows, two validation corpora).
  const readme = readFileSync(join(ROOT, "baselines/README.md"), "utf8");
  const m = /```sh\n(npx overask learn \.\.\/shared[\s\S]*?)```/.exec(readme);
  if (m && existsSync(join(ROOT, "../shared/datasets/drebin215/drebin215.csv"))) {
    const words = m[1].replace(/\\\n/g, " ").match(/"[^"]*"|\S+/g).map((w) => w.replace(/^"|"$/g, "")).slice(2);
    const i = words.indexOf("-o");
    words[i + 1] = join(OUT, "bench-default.json");
    const bundled = timed([process.execPath, join(ROOT, "bin/overask.js"), ...words]);
    console.log(`learn the bundled default baseline:   ${bundled.seconds.toFixed(1)} s, peak RSS ${bundled.rssMb.toFixed(0)} MB  (goal < 60 s)`);
  }
}

// ---------------------------------------------------------------------------------------------
if (ONLY.includes("check")) {
  header("check: one small APK, whole process, against starting node itself");
  const apk = join(ROOT, "fixtures/apk/tidewatch.apk");
  // Interleaved (floor, check, facts, floor, …) so that the machine's drift hits all three alike; medians of 25.
  const argvs = [["-e", "0"], [join(ROOT, "bin/overask.js"), "check", apk], [join(ROOT, "bin/overask.js"), "facts", apk]];
  const times = argvs.map(() => []);
  for (let i = 0; i < 25; i++) {
    argvs.forEach((argv, k) => {
      const t = process.hrtime.bigint();
      spawnSync(process.execPath, argv, { stdio: "ignore" });
      times[k].push(ms(t));
    });
  }
  const [floor, check, facts] = times.map(median);
  console.log(`node -e 0 (floor):        ${fmt(floor)} ms`);
  console.log(`overask check small.apk:  ${fmt(check)} ms (${(check / floor).toFixed(2)}x the floor; goal ≤ 1.8x)`);
  console.log(`overask facts small.apk:  ${fmt(facts)} ms (${(facts / floor).toFixed(2)}x the floor)`);

  const ROWS = Number(opt("check-rows", "1000000"));
  header(`check --records: ${ROWS.toLocaleString("en")} synthetic JSONL records, one process (one core)`);
  const path = join(OUT, `corpus-${ROWS}.jsonl`);
  if (!existsSync(path)) {
    console.log(`(generate it first with --only learn --learn-rows ${ROWS} --keep)`);
  } else {
    const floorT = process.hrtime.bigint();
    spawnSync(process.execPath, ["-e", `const rl=require("readline").createInterface({input:require("fs").createReadStream(${JSON.stringify(path)},{highWaterMark:1<<20}),crlfDelay:Infinity});let n=0;rl.on("line",l=>{if(l){const o=JSON.parse(l);process.stdout.write(JSON.stringify({id:o.id})+"\\n")}});`], { stdio: ["ignore", "ignore", "inherit"] });
    const floorS = ms(floorT) / 1000;
    const t = process.hrtime.bigint();
    const r = spawnSync("/usr/bin/time", ["-f", "%M", process.execPath, join(ROOT, "bin/overask.js"), "check", "--records", path, "--baseline", join(ROOT, "baselines/harbourview-demo.json")], { stdio: ["ignore", "ignore", "pipe"], encoding: "utf8" });
    const seconds = ms(t) / 1000;
    const rss = Number(r.stderr.trim().split("\n").pop()) / 1024;
    console.log(`floor (read, parse and write one line per record): ${floorS.toFixed(1)} s, ${Math.round(ROWS / floorS).toLocaleString("en")} records/s`);
    console.log(`check --records: ${seconds.toFixed(1)} s, ${Math.round(ROWS / seconds).toLocaleString("en")} records/s (goal ≥ 20,000), ${(seconds / floorS).toFixed(2)}x the floor, peak RSS ${rss.toFixed(0)} MB`);
  }
}

// ---------------------------------------------------------------------------------------------
if (ONLY.includes("sweep")) {
  const SMALL = Number(opt("sweep-small", "10000"));
  const LARGE = Number(opt("sweep-large", "200"));
  const LARGE_MB = Number(opt("sweep-large-mb", "50"));
  const manifest = lib.openArchiveFile(join(ROOT, "fixtures/apk/tidewatch.apk")).read("AndroidManifest.xml", "MAX_MANIFEST_BYTES");
  const TYPO = Number(opt("sweep-typo", "3000"));
  const sets = [
    // The demo lamp asks for a misspelt android.permission.* name: the typo search runs for every app.
    { key: "typo", name: `${TYPO.toLocaleString("en")} small APKs with a misspelt permission name`, dir: join(OUT, `sweep-typo-${TYPO}`), count: TYPO, make: (p) => copyFileSync(join(ROOT, "fixtures/apk/pocketlamp.apk"), p) },
    { key: "small", name: `${SMALL.toLocaleString("en")} small APKs`, dir: join(OUT, `sweep-small-${SMALL}`), count: SMALL, make: (p) => copyFileSync(join(ROOT, "fixtures/apk/tidewatch.apk"), p) },
    // Small APKs that carry dex code (two dex files, an app and a library package), to weigh code evidence.
    { key: "code", name: `${SMALL.toLocaleString("en")} small APKs with dex code`, dir: join(OUT, `sweep-code-${SMALL}`), count: SMALL, make: (p) => copyFileSync(join(ROOT, "fixtures/apk/beamtorch-code.apk"), p), code: true },
    { key: "large", name: `${LARGE} APKs of ${LARGE_MB} MB`, dir: join(OUT, `sweep-large-${LARGE}`), count: LARGE, make: (p) => writeSyntheticApk(p, LARGE_MB, Buffer.from(manifest)) },
  ];
  const hasAapt = spawnSync("aapt", ["version"], { stdio: "ignore" }).error === undefined;
  const SETS = opt("sweep-sets", "typo,small,code,large").split(",");
  for (const set of sets.filter((x) => SETS.includes(x.key))) {
    header(`sweep: ${set.name}, 2 jobs, against the floor (central directory + manifest entry of each, one thread)`);
    if (!existsSync(set.dir)) {
      mkdirSync(set.dir, { recursive: true });
      for (let i = 0; i < set.count; i++) set.make(join(set.dir, `app-${String(i).padStart(5, "0")}.apk`));
    }
    const files = readdirSync(set.dir).map((f) => join(set.dir, f));
    // --cold drops the page cache before each measurement (root only), so both read from the disk;
    // otherwise both read from a warm cache.
    const cold = args.includes("--cold");
    const prepare = () => {
      if (cold) execFileSync("sh", ["-c", "sync; echo 3 > /proc/sys/vm/drop_caches"]);
      else for (const f of files) floorRead(f);
    };
    prepare();
    let t = process.hrtime.bigint();
    for (const f of files) floorRead(f);
    const floorS = ms(t) / 1000;
    const fr = files.length / floorS;
    console.log(`page cache: ${cold ? "dropped before each run (--cold)" : "warm"}`);
    console.log(`floor: ${floorS.toFixed(2)} s, ${Math.round(fr).toLocaleString("en")} apps/s`);
    const out = join(OUT, "sweep-results.jsonl");
    const runSweep = (extra) => {
      prepare();
      const t0 = process.hrtime.bigint();
      const r = spawnSync("/usr/bin/time", ["-f", "%M", process.execPath, join(ROOT, "bin/overask.js"), "sweep", set.dir, "-o", out, "-j", "2", "-c", "TOOLS", ...extra], { stdio: ["ignore", "ignore", "pipe"], encoding: "utf8" });
      const seconds = ms(t0) / 1000;
      return { seconds, rate: files.length / seconds, rss: Number(r.stderr.trim().split("\n").pop()) / 1024 };
    };
    const withCode = runSweep([]);
    console.log(`sweep -j 2: ${withCode.seconds.toFixed(2)} s, ${Math.round(withCode.rate).toLocaleString("en")} apps/s = ${(withCode.rate / fr).toFixed(2)}x the floor's throughput (goal ≥ 0.5x), peak RSS ${withCode.rss.toFixed(0)} MB (goal < 300 MB)`);
    if (set.code) {
      const noCode = runSweep(["--no-code"]);
      console.log(`sweep -j 2 --no-code: ${noCode.seconds.toFixed(2)} s, ${Math.round(noCode.rate).toLocaleString("en")} apps/s = ${(noCode.rate / fr).toFixed(2)}x the floor; code evidence costs ${(withCode.seconds / noCode.seconds).toFixed(2)}x the time without it`);
    }
    if (hasAapt && set.count > 1000) {
      // A practitioner's alternative: the official toolchain's `aapt dump permissions`, one process an app
      // (as a shell loop over the inventory would run it). Timed over a sample of 300 apps, two at a time.
      const sample = files.slice(0, 300);
      const t1 = process.hrtime.bigint();
      for (let i = 0; i < sample.length; i += 2) {
        const pair = sample.slice(i, i + 2).map((f) => new Promise((res) => { const c = spawn("aapt", ["dump", "permissions", f], { stdio: "ignore" }); c.on("close", res); }));
        await Promise.all(pair);
      }
      const aaptRate = sample.length / (ms(t1) / 1000);
      console.log(`aapt dump permissions (2 at a time, 300-app sample): ${Math.round(aaptRate).toLocaleString("en")} apps/s; sweep -j 2 is ${(withCode.rate / aaptRate).toFixed(1)}x its throughput`);
    }
  }
}

// ---------------------------------------------------------------------------------------------
const hasRedis = spawnSync("redis-server", ["--version"], { stdio: "ignore" }).error === undefined;
if (ONLY.includes("queue") && !hasRedis) console.log("\n## queue: skipped (needs Debian's redis-server)");
if (ONLY.includes("queue") && hasRedis) {
  // One producer (sweep --queue) and 1 or 2 worker processes (overask work -j 1) on this machine, against a
  // local sweep of the same inputs; Redis is Debian's redis-server on 127.0.0.1 with no persistence.
  const COUNT = Number(opt("queue-apps", "5000"));
  const dir = join(OUT, `queue-${COUNT}`);
  if (!existsSync(dir)) {
    mkdirSync(dir, { recursive: true });
    for (let i = 0; i < COUNT; i++) copyFileSync(join(ROOT, "fixtures/apk/tidewatch.apk"), join(dir, `app-${String(i).padStart(5, "0")}.apk`));
  }
  header(`queue: ${COUNT.toLocaleString("en")} small APKs through Redis (BullMQ), 1 producer and 1 or 2 worker processes`);
  const port = 20000 + Math.floor(Math.random() * 20000);
  const redis = spawn("redis-server", ["--bind", "127.0.0.1", "--port", String(port), "--save", "", "--appendonly", "no"], { stdio: "ignore" });
  await new Promise((r) => setTimeout(r, 500));
  const bin = join(ROOT, "bin/overask.js");
  const out = join(OUT, "queue-results.jsonl");
  const local = spawnSync("/usr/bin/time", ["-f", "%e", process.execPath, bin, "sweep", dir, "-o", out, "-j", "2", "-c", "TOOLS"], { encoding: "utf8" });
  const localS = Number(local.stderr.trim().split("\n").pop());
  console.log(`local sweep -j 2: ${localS.toFixed(2)} s, ${Math.round(COUNT / localS).toLocaleString("en")} apps/s`);
  for (const workers of [1, 2]) {
    const url = `redis://127.0.0.1:${port}/bench${workers}`;
    const procs = Array.from({ length: workers }, () => spawn(process.execPath, [bin, "work", url, "-j", "1", "--drain"], { stdio: "ignore" }));
    const t = process.hrtime.bigint();
    const r = spawnSync(process.execPath, [bin, "sweep", dir, "-o", out, "-c", "TOOLS", "--queue", url], { encoding: "utf8" });
    const seconds = ms(t) / 1000;
    await Promise.all(procs.map((p) => new Promise((res) => (p.exitCode !== null ? res() : p.on("exit", res)))));
    const rows = readFileSync(out, "utf8").trim().split("\n").length;
    console.log(`sweep --queue, ${workers} worker process${workers === 1 ? "" : "es"}: ${seconds.toFixed(2)} s, ${Math.round(COUNT / seconds).toLocaleString("en")} apps/s (${rows} rows; exit ${r.status}) = ${(localS / seconds).toFixed(2)}x the local sweep's throughput`);
  }
  redis.kill();
}

// ---------------------------------------------------------------------------------------------
const hasSmali = spawnSync("smali", ["--version"], { stdio: "ignore" }).error === undefined;
if (ONLY.includes("code") && !hasSmali) console.log("\n## dex / code evidence: skipped (needs Debian's smali: apt-get install libsmali-java)");
if (ONLY.includes("code") && hasSmali) {
  const smaliDir = join(OUT, "smali-big");
  const dexPath = join(OUT, "big.dex");
  // 1,300 generated classes assemble to a dex of about 10 MB.
  const CLASSES = Number(opt("dex-classes", "1300"));
  if (!existsSync(dexPath)) {
    // Generated smali: classes with methods that call framework APIs (some in the permission maps) and
    // load string constants, assembled by Debian's smali into one large dex.
    mkdirSync(smaliDir, { recursive: true });
    const calls = [
      "invoke-virtual {p0}, Landroid/telephony/TelephonyManager;->getLine1Number()Ljava/lang/String;",
      "invoke-virtual {p0}, Ljava/lang/Object;->toString()Ljava/lang/String;",
      "invoke-virtual {p0}, Ljava/lang/Object;->hashCode()I",
      "invoke-static {}, Landroid/telephony/SmsManager;->getDefault()Landroid/telephony/SmsManager;",
    ];
    for (let c = 0; c < CLASSES; c++) {
      const lines = [`.class public Lorg/example/bulk/p${c % 40}/C${c};`, ".super Ljava/lang/Object;", ""];
      for (let m = 0; m < 24; m++) {
        lines.push(`.method public m${m}()V`, "    .registers 3");
        for (let k = 0; k < 6; k++) lines.push(`    ${calls[(c + m + k) % calls.length]}`, `    const-string v0, "org.example.bulk.value.${c}.${m}.${k}"`);
        lines.push("    return-void", ".end method", "");
      }
      writeFileSync(join(smaliDir, `C${c}.smali`), lines.join("\n"));
    }
    const t = process.hrtime.bigint();
    execFileSync("smali", ["assemble", "-o", dexPath, smaliDir]);
    console.log(`(assembled ${CLASSES} generated classes with smali in ${(ms(t) / 1000).toFixed(1)} s)`);
  }
  const dex = readFileSync(dexPath);
  header(`dex: reading a ${(dex.length / 1e6).toFixed(1)} MB dex, against a floor that only walks the same id tables`);
  // Floor: the header's table offsets, then every string (length and bytes touched) and every type, proto,
  // field and method id — the least any reader of the id tables must do.
  const floorWalk = (b) => {
    const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
    const u32 = (o) => v.getUint32(o, true);
    let sum = 0;
    const [sN, sAt, tN, tAt, pN, pAt, fN, fAt, mN, mAt, cN, cAt] = [56, 60, 64, 68, 72, 76, 80, 84, 88, 92, 96, 100].map(u32);
    for (let i = 0; i < sN; i++) {
      let o = u32(sAt + 4 * i);
      let len = 0, shift = 0, byte;
      do { byte = b[o++]; len |= (byte & 0x7f) << shift; shift += 7; } while (byte & 0x80);
      while (b[o] !== 0) sum = (sum + b[o++]) | 0;
      sum = (sum + len) | 0;
    }
    for (let i = 0; i < tN; i++) sum = (sum + u32(tAt + 4 * i)) | 0;
    for (let i = 0; i < pN; i++) sum = (sum + u32(pAt + 12 * i) + u32(pAt + 12 * i + 4) + u32(pAt + 12 * i + 8)) | 0;
    for (let i = 0; i < fN; i++) sum = (sum + u32(fAt + 8 * i) + u32(fAt + 8 * i + 4)) | 0;
    for (let i = 0; i < mN; i++) sum = (sum + u32(mAt + 8 * i) + u32(mAt + 8 * i + 4)) | 0;
    for (let i = 0; i < cN; i++) sum = (sum + u32(cAt + 32 * i)) | 0;
    return sum;
  };
  for (let i = 0; i < 3; i++) {
    lib.readDex(dex);
    floorWalk(dex);
  }
  const readT = [];
  const floorT = [];
  for (let i = 0; i < 9; i++) {
    let t = process.hrtime.bigint();
    floorWalk(dex);
    floorT.push(ms(t));
    t = process.hrtime.bigint();
    lib.readDex(dex);
    readT.push(ms(t));
  }
  const parsed = lib.readDex(dex);
  console.log(`ids: ${parsed.stringCount.toLocaleString("en")} strings, ${parsed.methodCount.toLocaleString("en")} method ids, ${parsed.classes.length.toLocaleString("en")} classes`);
  console.log(`floor (walk the id tables):        median ${fmt(median(floorT))} ms`);
  console.log(`readDex (ids + every method's code): median ${fmt(median(readT))} ms = ${(median(readT) / median(floorT)).toFixed(2)}x the floor (goal within 3x)`);

  header("check with and without code evidence: a 50 MB APK with 3 dex files (whole CLI run)");
  const apk = join(OUT, "code-50mb.apk");
  const manifest = lib.openArchiveFile(join(ROOT, "fixtures/apk/beamtorch.apk")).read("AndroidManifest.xml", "MAX_MANIFEST_BYTES");
  const dexMb = (3 * dex.length) / (1024 * 1024);
  writeSyntheticApk(apk, Math.max(0, Math.round(50 - dexMb)), Buffer.from(manifest), [["classes.dex", dex], ["classes2.dex", dex], ["classes3.dex", dex]]);
  const runCheck = (extra) => {
    const t = process.hrtime.bigint();
    const r = spawnSync(process.execPath, [join(ROOT, "bin/overask.js"), "check", "-c", "TOOLS", ...extra, apk], { encoding: "utf8" });
    if (r.status !== 0 && r.status !== 1) throw new Error(r.stderr);
    return ms(t);
  };
  runCheck([]);
  const withCode = [];
  const without = [];
  for (let i = 0; i < 5; i++) {
    without.push(runCheck(["--no-code"]));
    withCode.push(runCheck([]));
  }
  const startup = [];
  for (let i = 0; i < 5; i++) {
    const t = process.hrtime.bigint();
    spawnSync(process.execPath, ["-e", "0"]);
    startup.push(ms(t));
  }
  console.log(`node -e 0 (process start floor): median ${fmt(median(startup))} ms`);
  console.log(`check --no-code:                 median ${fmt(median(without))} ms`);
  console.log(`check (code evidence, 3 dex):    median ${fmt(median(withCode))} ms = ${(median(withCode) / median(without)).toFixed(2)}x check --no-code`);

  header("dex reading + call graph: the same 10 MB dex, against the id-table floor");
  const manifestModel = lib.readManifestBytes(readFileSync(join(ROOT, "fixtures/apk/beamtorch.apk")));
  const graphT = [];
  for (let i = 0; i < 3; i++) lib.codeEvidence(manifestModel, [{ entry: "classes.dex", dex: lib.readDex(dex) }]);
  for (let i = 0; i < 7; i++) {
    const t = process.hrtime.bigint();
    lib.codeEvidence(manifestModel, [{ entry: "classes.dex", dex: lib.readDex(dex) }]);
    graphT.push(ms(t));
  }
  console.log(`readDex + hierarchy + call graph + evidence: median ${fmt(median(graphT))} ms = ${(median(graphT) / median(floorT)).toFixed(2)}x the floor (goal within 5x)`);

  // An APK of realistic shape: 11 dex files, ~9,900 classes, almost all library code that calls within its
  // library, implements framework listeners and reaches mapped APIs; the app's activity calls into a few libraries.
  header("check on a multi-dex APK of realistic shape (whole CLI run, peak RSS)");
  const DEXES = Number(opt("real-dexes", "11"));
  const PER = Number(opt("real-classes", "900"));
  const realApk = join(OUT, "realistic.apk");
  if (!existsSync(realApk)) {
    const t0 = process.hrtime.bigint();
    const apis = [
      "invoke-virtual {v1}, Landroid/telephony/TelephonyManager;->getLine1Number()Ljava/lang/String;",
      "invoke-virtual {v1}, Landroid/net/ConnectivityManager;->getActiveNetworkInfo()Landroid/net/NetworkInfo;",
      "invoke-virtual {v1}, Landroid/os/PowerManager$WakeLock;->acquire()V",
      "invoke-virtual {v1}, Ljava/lang/Object;->hashCode()I",
      "invoke-virtual {v1}, Ljava/lang/Object;->toString()Ljava/lang/String;",
    ];
    const entries = [];
    for (let d = 0; d < DEXES; d++) {
      const dir = join(OUT, `real-smali-${d}`);
      mkdirSync(dir, { recursive: true });
      const pkg = d === 0 ? "org/example/beamtorch" : `org/example/lib${d}`;
      for (let c = 0; c < PER; c++) {
        const cls = `L${pkg}/p${c % 30}/K${c};`;
        const next = `L${pkg}/p${(c + 1) % 30}/K${(c + 1) % PER};`;
        const lines = [`.class public ${cls}`, ".super Ljava/lang/Object;", c % 5 === 0 ? ".implements Ljava/lang/Runnable;" : "", ""];
        lines.push(".method public constructor <init>()V", "    .registers 1", "    invoke-direct {p0}, Ljava/lang/Object;-><init>()V", "    return-void", ".end method", "");
        if (c % 5 === 0) lines.push(".method public run()V", "    .registers 2", `    invoke-static {}, ${next}->s0()V`, "    return-void", ".end method", "");
        for (let m = 0; m < 8; m++) {
          lines.push(`.method public static s${m}()V`, "    .registers 3", "    const/4 v1, 0x0");
          for (let k = 0; k < 5; k++) lines.push(`    ${apis[(c + m + k) % apis.length]}`, `    const-string v0, "org.example.value.${d}.${c}.${m}.${k}"`);
          if (m === 0 && c % 7 === 0) lines.push(`    new-instance v2, ${next}`, `    invoke-direct {v2}, ${next}-><init>()V`);
          if (m < 7) lines.push(`    invoke-static {}, ${cls}->s${m + 1}()V`);
          lines.push("    return-void", ".end method", "");
        }
        writeFileSync(join(dir, `K${c}.smali`), lines.join("\n"));
      }
      if (d === 0) {
        // The app's launcher activity (the beamtorch manifest names org.example.beamtorch.Torch): calls two libraries.
        writeFileSync(join(dir, "Torch.smali"), [".class public Lorg/example/beamtorch/Torch;", ".super Landroid/app/Activity;", "", ".method public constructor <init>()V", "    .registers 1", "    invoke-direct {p0}, Landroid/app/Activity;-><init>()V", "    return-void", ".end method", "", ".method protected onCreate(Landroid/os/Bundle;)V", "    .registers 2", "    invoke-static {}, Lorg/example/lib1/p0/K0;->s0()V", "    invoke-static {}, Lorg/example/lib2/p0/K0;->s0()V", "    return-void", ".end method", ""].join("\n"));
      }
      const out = join(OUT, `real-${d}.dex`);
      execFileSync("smali", ["assemble", "-o", out, dir]);
      entries.push([d === 0 ? "classes.dex" : `classes${d + 1}.dex`, readFileSync(out)]);
    }
    const dexBytes = entries.reduce((n, [, b]) => n + b.length, 0);
    // Padding (resources, assets) so the file is the size of a real app's APK (the dex compress well).
    writeSyntheticApk(realApk, 14, Buffer.from(manifest), entries);
    console.log(`(generated ${DEXES} dex files, ${(DEXES * PER + 1).toLocaleString("en")} classes, ${(dexBytes / 1e6).toFixed(1)} MB of dex, with smali in ${(ms(t0) / 1000).toFixed(1)} s)`);
  }
  console.log(`APK size: ${(statSync(realApk).size / 1e6).toFixed(1)} MB`);
  const timedCheck = (extra) => {
    const t = process.hrtime.bigint();
    const r = spawnSync("/usr/bin/time", ["-f", "%M", process.execPath, join(ROOT, "bin/overask.js"), "check", "-c", "TOOLS", ...extra, realApk], { encoding: "utf8" });
    if (r.status !== 0 && r.status !== 1) throw new Error(r.stderr);
    return { ms: ms(t), rss: Number(r.stderr.trim().split("\n").pop()) / 1024, out: r.stdout };
  };
  const first = timedCheck([]);
  const codeLine = /code {8}(.*?)\n\n/s.exec(first.out)?.[1]?.replace(/\s+/g, " ");
  if (codeLine) console.log(`code line: ${codeLine}`);
  const realWith = [];
  const realWithout = [];
  let rssWith = 0;
  for (let i = 0; i < 5; i++) {
    realWithout.push(timedCheck(["--no-code"]).ms);
    const r = timedCheck([]);
    realWith.push(r.ms);
    rssWith = Math.max(rssWith, r.rss);
  }
  console.log(`check --no-code:                 median ${fmt(median(realWithout))} ms`);
  console.log(`check (code evidence, call graph): median ${fmt(median(realWith))} ms = ${(median(realWith) / median(realWithout)).toFixed(2)}x check --no-code (goal within 3x), peak RSS ${rssWith.toFixed(0)} MB (goal < 512 MB)`);
}

if (!args.includes("--keep")) rmSync(OUT, { recursive: true, force: true });
