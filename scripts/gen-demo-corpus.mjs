#!/usr/bin/env node
// Generates the invented Harbourview demo corpus (fixtures/corpus/harbourview.jsonl): apps of an invented
// regional catalogue, each with a category, requested permissions, and whether Harbourview's (invented)
// reviewers flagged it for asking too much. Seeded, so the file is the same on every run.
//   node scripts/gen-demo-corpus.mjs [--seed 7] [--apps 1500]
import { writeFileSync } from "node:fs";

const args = process.argv.slice(2);
const opt = (k, d) => (args.includes(`--${k}`) ? Number(args[args.indexOf(`--${k}`) + 1]) : d);
const seed = opt("seed", 7);
const apps = opt("apps", 1500);

let a = seed >>> 0; // mulberry32, as src/util/random.ts
const rand = () => {
  a = (a + 0x6d2b79f5) >>> 0;
  let t = a;
  t = Math.imul(t ^ (t >>> 15), t | 1);
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
};
const P = (s) => `android.permission.${s}`;

// How often apps of each category request each permission (invented figures).
const common = { INTERNET: 0.95, ACCESS_NETWORK_STATE: 0.8, WAKE_LOCK: 0.35, VIBRATE: 0.3, RECEIVE_BOOT_COMPLETED: 0.2, POST_NOTIFICATIONS: 0.4 };
const categories = {
  Tools: { share: 0.3, p: { ...common, CAMERA: 0.25, FLASHLIGHT: 0.05, WRITE_EXTERNAL_STORAGE: 0.3, READ_EXTERNAL_STORAGE: 0.3, ACCESS_FINE_LOCATION: 0.1 } },
  Communication: { share: 0.2, p: { ...common, READ_CONTACTS: 0.6, RECORD_AUDIO: 0.55, CAMERA: 0.5, READ_PHONE_STATE: 0.4, SEND_SMS: 0.08, FOREGROUND_SERVICE: 0.4 } },
  Education: { share: 0.3, p: { ...common, RECORD_AUDIO: 0.15, CAMERA: 0.12, READ_EXTERNAL_STORAGE: 0.2 } },
  Social: { share: 0.19, p: { ...common, CAMERA: 0.6, ACCESS_FINE_LOCATION: 0.55, ACCESS_COARSE_LOCATION: 0.6, READ_CONTACTS: 0.3, READ_MEDIA_IMAGES: 0.4 } },
  Weather: { share: 0.01, p: { ...common, ACCESS_COARSE_LOCATION: 0.9, ACCESS_FINE_LOCATION: 0.3 } },
};
// What flagged apps add: sensitive permissions their category rarely needs.
const overreach = ["READ_SMS", "SEND_SMS", "READ_CALL_LOG", "READ_CONTACTS", "ACCESS_FINE_LOCATION", "ACCESS_BACKGROUND_LOCATION", "RECORD_AUDIO", "SYSTEM_ALERT_WINDOW", "READ_PHONE_STATE", "GET_ACCOUNTS", "REQUEST_INSTALL_PACKAGES", "PACKAGE_USAGE_STATS"];
const words = ["tide", "harbour", "lantern", "gull", "quay", "reef", "buoy", "pier", "kelp", "anchor", "compass", "drift", "shore", "beacon"];

const names = Object.keys(categories);
const lines = [];
for (let i = 0; i < apps; i++) {
  let r = rand();
  let category = names[names.length - 1];
  for (const n of names) {
    if ((r -= categories[n].share) < 0) { category = n; break; }
  }
  const perms = new Set();
  for (const [p, q] of Object.entries(categories[category].p)) if (rand() < q) perms.add(P(p));
  const flagged = rand() < 0.18;
  if (flagged) {
    const extra = 1 + Math.floor(rand() * 4);
    for (let k = 0; k < extra; k++) perms.add(P(overreach[Math.floor(rand() * overreach.length)]));
  } else if (rand() < 0.1) perms.add(P(overreach[Math.floor(rand() * overreach.length)]));
  const w = () => words[Math.floor(rand() * words.length)];
  lines.push(JSON.stringify({ id: `org.example.${w()}${w()}${i}`, category, permissions: [...perms].sort(), flagged: flagged ? "yes" : "no" }));
}
writeFileSync(new URL("../fixtures/corpus/harbourview.jsonl", import.meta.url), `${lines.join("\n")}\n`);
console.log(`wrote ${apps} invented apps to fixtures/corpus/harbourview.jsonl`);
