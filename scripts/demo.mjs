#!/usr/bin/env node
// `npm run demo`: runs overask on the bundled demo apps of the invented Harbourview catalogue
// (fixtures/apk, built from fixtures/apps by scripts/build-fixtures.sh).
import { fileURLToPath } from "node:url";
import { run } from "../dist/cli/main.js";

const root = fileURLToPath(new URL("../", import.meta.url));
process.chdir(root);
console.log("# overask facts: what the over-asking torch app and the tide-table app declare\n");
process.exitCode = await run(["facts", "fixtures/apk/pocketlamp.apk", "fixtures/apk/tidewatch.apk"]);
