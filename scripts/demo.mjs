#!/usr/bin/env node
// `npm run demo`: overask on the bundled demo apps of the invented Harbourview catalogue
// (fixtures/apk, built from fixtures/apps by scripts/build-fixtures.sh), judged against the bundled
// default baseline.
import { fileURLToPath } from "node:url";
import { run } from "../dist/bundle/main.js";

const root = fileURLToPath(new URL("../", import.meta.url));
process.chdir(root);
const say = (s) => console.log(`\n\u001b[2m# ${s}\u001b[0m\n`.replace(/\u001b\[[0-9;]*m/g, process.stdout.isTTY && !process.env.NO_COLOR ? "$&" : ""));

say("overask check: the over-asking torch app, judged as a Tools app");
await run(["check", "--category", "TOOLS", "fixtures/apk/pocketlamp.apk"]);
say("overask check: the tide-table app, as a Tools app");
await run(["check", "--category", "TOOLS", "fixtures/apk/tidewatch.apk"]);
say("overask trim: what the torch app's developer could remove");
await run(["trim", "--category", "TOOLS", "fixtures/apps/pocketlamp/AndroidManifest.xml"]);
process.exitCode = 0;
