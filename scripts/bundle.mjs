#!/usr/bin/env node
// Bundles the CLI with esbuild into dist/bundle/: one entry plus chunks that load per command, so that
// `overask check` starts without loading the learning code, and without resolving dozens of modules.
// xml2js, cli-progress and protobufjs stay outside the bundle: they are loaded only when needed
// (createRequire); bullmq and ioredis load with the queue commands only.
import { rmSync } from "node:fs";
import { build } from "esbuild";

// Start from an empty folder: chunks of earlier builds would pile up (their names are content hashes).
rmSync("dist/bundle", { recursive: true, force: true });

// commander requires node:child_process when it loads, for subcommands run as separate executables, which
// overask never uses; loading it costs several milliseconds of every start. commander gets a stand-in that
// loads the real module on first use.
const lazyChildProcess = {
  name: "lazy-child-process",
  setup(b) {
    b.onResolve({ filter: /^node:child_process$/ }, (args) => (/node_modules[\\/]commander[\\/]/.test(args.importer) ? { path: "child_process", namespace: "overask-lazy" } : undefined));
    b.onLoad({ filter: /.*/, namespace: "overask-lazy" }, () => ({
      contents: 'let real; module.exports = new Proxy({}, { get: (_, key) => (real ??= require("node:child_process"))[key] });',
      loader: "js",
    }));
  },
};

await build({
  plugins: [lazyChildProcess],
  entryPoints: { main: "src/cli/main.ts", "sweep-worker": "src/ops/sweep/worker.ts", "queue-worker": "src/ops/queue/thread.ts" },
  outdir: "dist/bundle",
  bundle: true,
  splitting: true,
  format: "esm",
  platform: "node",
  target: "node20",
  external: ["xml2js", "cli-progress", "bullmq", "ioredis", "protobufjs"],
  banner: { js: 'import { createRequire as __overaskRequire } from "node:module"; const require = __overaskRequire(import.meta.url);' },
  logLevel: "warning",
  legalComments: "linked",
});
