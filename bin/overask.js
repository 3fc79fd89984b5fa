#!/usr/bin/env node
// Entry point of the `overask` command. The TypeScript sources are compiled to dist/ by `npm run build`
// (run automatically by `npm ci` / `npm install` through the `prepare` script).
import { run } from "../dist/cli/main.js";

process.exitCode = await run(process.argv.slice(2));
