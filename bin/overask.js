#!/usr/bin/env node
// Entry point of the `overask` command. The TypeScript sources are compiled by `npm run build` (run
// automatically by `npm ci` / `npm install` through the `prepare` script): the library to dist/, and the
// CLI to one bundle in dist/bundle/ so that it starts quickly.
import { run } from "../dist/bundle/main.js";

// A reader that stops early (`overask check … | head`) closes the pipe: the output ends there, quietly.
for (const stream of [process.stdout, process.stderr]) {
  stream.on("error", (e) => {
    if (e.code !== "EPIPE") throw e;
    process.exit(process.exitCode ?? 0);
  });
}

process.exitCode = await run(process.argv.slice(2));
// A worker that let go of an unreachable Redis (exit 6) may still hold its client's reconnect timers: it
// ends here rather than wait on them.
if (process.exitCode === 6) process.exit(6);
