/**
 * The sweep's HTML report in a real headless browser: Debian's chromium driven by playwright-core. It must
 * load with no console errors and no network requests, and sorting, filtering and expanding must work by
 * clicking. A screenshot is saved for a person to look at. Skipped, saying so, without chromium.
 */
import { existsSync, mkdtempSync, readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { chromium, type BrowserContext } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cli } from "../../helpers/cli.js";
import { FIXTURES, ROOT } from "../../helpers/paths.js";

const CHROMIUM = "/usr/bin/chromium";
const hasChromium = existsSync(CHROMIUM);
if (!hasChromium) console.warn("HTML report browser test skipped: no /usr/bin/chromium (apt-get install chromium)");

describe.runIf(hasChromium)("the sweep's HTML report in chromium", () => {
  const dir = mkdtempSync(join(tmpdir(), "overask-html-"));
  const report = join(dir, "report.html");
  let browser: BrowserContext;

  beforeAll(async () => {
    const { code } = await cli(["sweep", `${FIXTURES}apk`, "-o", join(dir, "r.jsonl"), "--html", report, "-b", `${ROOT}baselines/harbourview-demo.json`, "-j", "1"]);
    expect(code).toBe(0);
    // A fresh profile folder for every run.
    browser = await chromium.launchPersistentContext(join(dir, "profile"), {
      executablePath: CHROMIUM,
      headless: true,
      viewport: { width: 1200, height: 1400 },
      args: ["--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    });
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
  });

  it("loads with no console errors and no requests beyond the file, sorts, filters and expands by clicking", async () => {
    const page = await browser.newPage();
    const problems: string[] = [];
    const requests: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error" || m.type() === "warning") problems.push(m.text());
    });
    page.on("pageerror", (e) => problems.push(e.message));
    page.on("request", (r) => requests.push(r.url()));
    await page.goto(`file://${report}`);
    await page.waitForSelector("#apps tbody tr.app");
    expect(problems).toEqual([]);
    expect(requests.filter((u) => !u.startsWith("file://"))).toEqual([]);

    const risks = async () => page.$$eval("#apps tbody tr.app td:nth-child(3)", (tds) => tds.map((td) => td.textContent ?? ""));
    const byRiskDesc = await risks();
    expect(byRiskDesc.length).toBe(readdirSync(`${FIXTURES}apk`).filter((f) => f.endsWith(".apk")).length);
    await page.click('th[data-key="risk"]'); // now ascending
    expect(await page.getAttribute('th[data-key="risk"]', "aria-sort")).toBe("ascending");
    expect(await risks()).toEqual([...byRiskDesc].reverse());

    await page.click('th[data-key="app"]');
    const apps = await page.$$eval("#apps tbody tr.app td:first-child div:first-child", (ds) => ds.map((d) => d.textContent ?? ""));
    expect(apps).toEqual([...apps].sort());

    await page.selectOption("#f-check", "special-access-component");
    expect(await page.$$eval("#apps tbody tr.app", (rows) => rows.length)).toBe(1);
    expect(await page.textContent("#shown")).toBe(`1 of ${byRiskDesc.length} shown`);

    await page.click("#apps tbody tr.app");
    expect(await page.isVisible("#apps tbody tr.details")).toBe(true);
    expect(await page.textContent("#apps tbody tr.details")).toMatch(/special-access-component/);

    expect(await page.$$eval("#histogram svg rect", (r) => r.length)).toBeGreaterThan(0);
    expect(await page.textContent("#caution")).toMatch(/not evidence of intent or harm/);
    await page.selectOption("#f-check", "");
    const shot = join(dir, "report.png");
    await page.screenshot({ path: shot, fullPage: true });
    expect(existsSync(shot)).toBe(true);
    console.log(`screenshot of the HTML report: ${shot}`);
    expect(problems).toEqual([]);
  }, 60_000);
});
