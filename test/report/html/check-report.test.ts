/**
 * `check --format html` in a real headless browser (Debian's chromium, playwright-core): one self-contained
 * page, no console errors, no network requests, findings grouped by level with their explanations, a bar
 * per judged permission, and a print layout. A screenshot is saved for a person to look at. Skipped,
 * saying so, without chromium.
 */
import { existsSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { BrowserContext } from "playwright-core";
import { hasChromium, launchBrowser, watchedPage } from "../../helpers/browser.js";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cli } from "../../helpers/cli.js";
import { APK_DIR } from "../../helpers/paths.js";


describe.runIf(hasChromium)("the check report in chromium", () => {
  const dir = mkdtempSync(join(tmpdir(), "overask-check-html-"));
  const page1 = join(dir, "check.html");
  let browser: BrowserContext;

  beforeAll(async () => {
    const { code, stdout } = await cli(["check", "-c", "TOOLS", "-f", "html", `${APK_DIR}pocketlamp.apk`, `${APK_DIR}snapshare.apk`, join(dir, "missing.apk")]);
    expect(code).toBe(3); // one input could not be read; the page still holds the others
    writeFileSync(page1, stdout);
    browser = await launchBrowser(dir, { width: 1000, height: 1400 });
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
  });

  it("shows each app's header, risk and caution, grouped findings and permission bars, with no errors or requests", async () => {
    const { page, problems, requests } = await watchedPage(browser);
    await page.goto(`file://${page1}`);
    expect(problems).toEqual([]);
    expect(requests.filter((u) => !u.startsWith("file://"))).toEqual([]);
    expect(await page.$$eval("section.app h2", (h) => h.map((x) => x.textContent))).toEqual(["org.example.pocketlamp — Pocket Lamp", expect.stringMatching(/^org\.example\.snapshare — Snapshare/)]);
    expect(await page.textContent("body")).toMatch(/missing\.apk: no such file/);
    const lamp = page.locator("section.app").first();
    expect(await lamp.locator(".risk .caution").textContent()).toMatch(/not evidence of intent or harm/);
    // The demo app is debuggable (a warning) and asks to draw over other apps (a special-access note).
    expect(await lamp.locator("h4").allTextContents()).toEqual(["Warnings (5)", "Notes (7)"]);
    expect(await lamp.locator("ul.findings li").first().textContent()).toMatch(/application\s*\(warning: debuggable\)/);
    expect(await lamp.locator("ul.findings li").nth(1).textContent()).toMatch(/READ_SMS\s*\(warning: sensitive-uncommon\)\s*18 of 2318 TOOLS apps request it/);
    // A bar for each requested permission frequency judges; READ_SMS's is red (uncommon).
    expect(await lamp.locator("table.perms tbody tr").count()).toBe(14);
    expect(await lamp.locator("tr:has-text('READ_SMS') .bar.uncommon").count()).toBe(1);
    expect(await page.locator("section.app").nth(1).locator("td:has-text('declared by this app')").count()).toBe(1);
    // The risk's breakdown, and for each requested permission who grants it and its protection level.
    expect(await lamp.locator(".risk .breakdown").first().textContent()).toMatch(/Raised most by/);
    expect(await lamp.locator("table.perms tbody tr").filter({ hasText: "READ_SMS" }).textContent()).toMatch(/runtime prompt\s*dangerous/);
    expect(await lamp.locator("table.perms tbody tr").filter({ hasText: "SYSTEM_ALERT_WINDOW" }).textContent()).toMatch(/special access, by hand/);
    await page.setViewportSize({ width: 1400, height: 900 });
    const shot = join(dir, "check.png");
    await page.screenshot({ path: shot, fullPage: true });
    console.log(`screenshot of the check report: ${shot}`);
  }, 60_000);

  it("shows maxSdkVersion and code evidence beside each permission", async () => {
    // stridecoach (fixtures/apps/stridecoach) limits BLUETOOTH with maxSdkVersion="30"; beamtorch-code's dex
    // (fixtures/smali/beamtorch) reaches READ_SMS and never CAMERA.
    const { stdout } = await cli(["check", "-c", "TOOLS", "-f", "html", `${APK_DIR}stridecoach.apk`, `${APK_DIR}beamtorch-code.apk`]);
    const page2 = join(dir, "check2.html");
    writeFileSync(page2, stdout);
    const page = await browser.newPage();
    await page.goto(`file://${page2}`);
    const rows = async (app: number) =>
      page.locator("section.app").nth(app).locator("table.perms tbody tr").evaluateAll((trs) => trs.map((tr) => ((tr as unknown as { innerText: string }).innerText ?? "").replace(/\\s+/g, " ").trim()));
    const row = async (app: number, name: string) => (await rows(app)).find((t) => t.split(/\s/)[0] === name);
    expect(await row(0, "BLUETOOTH")).toMatch(/up to SDK 30/);
    expect(await row(1, "READ_SMS")).toMatch(/code: used by/);
    expect(await row(1, "CAMERA")).toMatch(/code: not seen/);
    expect(await page.$$eval("table.overview tbody tr", (r) => r.length)).toBe(2);
  }, 60_000);

  it("prints the overview first, then each app on its own pages", async () => {
    const page = await browser.newPage();
    await page.goto(`file://${page1}`);
    await page.emulateMedia({ media: "print" });
    // The overview (one row an app: risk, band, errors, warnings, notes) is kept in print: it is the summary.
    expect(await page.$eval("table.overview", (n) => (globalThis as any).getComputedStyle(n).display)).not.toBe("none");
    expect(await page.$$eval("table.overview tbody tr", (r) => r.length)).toBe(2);
    expect(await page.$$eval("section.app", (s) => s.map((x) => (globalThis as any).getComputedStyle(x).breakBefore))).toEqual(["auto", "page"]);
    const pdf = join(dir, "check.pdf");
    await page.pdf({ path: pdf });
    expect(existsSync(pdf)).toBe(true);
  }, 60_000);
});
