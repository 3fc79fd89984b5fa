/** The graded risk as each command shows it: base rate, likelihood ratio, prevalence, atypicality. */
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { cli } from "../helpers/cli.js";
import { APK_DIR, FIXTURES } from "../helpers/paths.js";

const dir = mkdtempSync(join(tmpdir(), "overask-risk-"));

describe("risk output", () => {
  it("check says which base rate applies, the likelihood ratio, the prevalence figure and the atypicality", async () => {
    const out = (await cli(["check", "-c", "TOOLS", "--prevalence", "0.05", `${APK_DIR}pocketlamp.apk`])).stdout.replace(/\s+/g, " ");
    expect(out).toMatch(/Risk \d+% — \w+ \(base rate 37%; likelihood ratio \d+\.\d\d\)/);
    expect(out).toMatch(/at a prevalence of 5\.0% \(--prevalence\): \d+(\.\d)?% — \w+/);
    expect(out).toMatch(/atypicality: more atypical than \d+% of TOOLS apps in the baseline/);
    expect(out).toMatch(/How well it ranks: in-corpus ROC AUC 0\.\d\d; later apps of 2019 \(KronoDroid\) 0\.\d\d/);
  });

  it("trim ranks by the real drop: removing SEND_SMS lowers the torch app's risk most", async () => {
    const plan = JSON.parse((await cli(["trim", "-c", "TOOLS", "-f", "json", `${FIXTURES}apps/pocketlamp/AndroidManifest.xml`])).stdout);
    expect(plan.candidates[0].permission).toBe("android.permission.SEND_SMS");
    expect(plan.candidates[0].riskWithout).toBeLessThan(plan.risk - 0.2);
    expect(plan.baseRate).toBeCloseTo(0.37, 2);
  });

  it("sweep rows carry the atypicality and the risk at the user's prevalence", async () => {
    const out = join(dir, "r.jsonl");
    await cli(["sweep", `${APK_DIR}pocketlamp.apk`, "-o", out, "-c", "TOOLS", "--prevalence", "0.05"]);
    const row = JSON.parse(readFileSync(out, "utf8"));
    expect(row.atypicality).toBeGreaterThan(50);
    expect(row.riskAtPrevalence).toBeLessThan(row.risk);
  });
});
