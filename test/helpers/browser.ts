/**
 * Debian's chromium driven by playwright-core, for the HTML pages' tests: a fresh profile folder for every
 * run, and the flags that keep it off the network.
 */
import { existsSync } from "node:fs";
import { join } from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";

export const CHROMIUM = "/usr/bin/chromium";
export const hasChromium = existsSync(CHROMIUM);

export function launchBrowser(dir: string, viewport = { width: 1200, height: 1400 }): Promise<BrowserContext> {
  return chromium.launchPersistentContext(join(dir, "profile"), {
    executablePath: CHROMIUM,
    headless: true,
    viewport,
    args: ["--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
}

/** A new page that records console errors and warnings, page errors, and every request. */
export async function watchedPage(browser: BrowserContext): Promise<{ page: Page; problems: string[]; requests: string[] }> {
  const page = await browser.newPage();
  const problems: string[] = [];
  const requests: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error" || m.type() === "warning") problems.push(m.text());
  });
  page.on("pageerror", (e) => problems.push(e.message));
  page.on("request", (r) => requests.push(r.url()));
  return { page, problems, requests };
}
