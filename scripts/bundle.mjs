#!/usr/bin/env node
// Bundles the CLI with esbuild into dist/bundle/: one entry plus chunks that load per command, so that
// `overask check` starts without loading the learning code, and without resolving dozens of modules.
// xml2js, cli-progress, protobufjs and adm-zip stay outside the bundle: they are loaded only when needed
// (createRequire); bullmq and ioredis load with the queue commands only.
import { rmSync } from "node:fs";
import { build } from "esbuild";

// Start from an empty folder: chunks of earlier builds would pile up (their names are content hashes).
rmSync("dist/bundle", { recursive: true, force: true });

await build({
  entryPoints: { main: "src/cli/main.ts", "sweep-worker": "src/ops/sweep/worker.ts", "queue-worker": "src/ops/queue/thread.ts" },
  outdir: "dist/bundle",
  bundle: true,
  splitting: true,
  format: "esm",
  platform: "node",
  target: "node20",
  external: ["xml2js", "cli-progress", "bullmq", "ioredis", "protobufjs", "adm-zip"],
  banner: { js: 'import { createRequire as __overaskRequire } from "node:module"; const require = __overaskRequire(import.meta.url);' },
  logLevel: "warning",
  legalComments: "linked",
});
