// Browser tests drive Debian's Chromium through playwright-core.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { appUrl } from "./env";
import { demoPassword, type DemoRole } from "./http";

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
}

export async function signInAs(page: Page, role: DemoRole): Promise<void> {
  await page.goto(new URL("/sign-in", appUrl()).toString());
  await page.fill("#email", `${role}@ordwise.test`);
  await page.fill("#password", demoPassword);
  await page.click("button[type=submit]");
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
}

/**
 * A new page (of `viewport` size, else the browser's default) signed in as `role` and, with `path`,
 * opened there: the first three steps of most browser tests.
 *
 * @example const page = await openSignedIn(browser, "engineer", { path: `/captures/${id}`, viewport: { width: 390, height: 844 } });
 */
export async function openSignedIn(browser: Browser, role: DemoRole, { path: at, viewport }: { path?: string; viewport?: { width: number; height: number } } = {}): Promise<Page> {
  const page = await browser.newPage(viewport ? { viewport } : undefined);
  await signInAs(page, role);
  if (at !== undefined) await page.goto(url(at));
  return page;
}

/** Where a file for a person to look at goes: the test data dir's screenshots/ (created on first use). */
export function artifactPath(fileName: string): string {
  const dir = path.join(process.env.TEST_DATA_DIR ?? os.tmpdir(), "screenshots");
  fs.mkdirSync(dir, { recursive: true });
  return path.join(dir, fileName);
}

/** Saves a screenshot (the whole page, or only the viewport) for a person to look at. */
export async function snap(page: Page, name: string, { fullPage = true }: { fullPage?: boolean } = {}): Promise<void> {
  await page.screenshot({ path: artifactPath(`${name}.png`), fullPage });
}

/** Scrolls the first element matching `selector` to the top and saves the viewport. */
export async function snapAt(page: Page, name: string, selector: string): Promise<void> {
  await page.locator(selector).first().evaluate((el) => el.scrollIntoView({ block: "start" }));
  await snap(page, name, { fullPage: false });
}

export const url = (p: string) => new URL(p, appUrl()).toString();

/**
 * On the new-capture page: chooses the site whose name starts with `site`, the file (a path or its
 * bytes) and a title, submits, and waits for the capture's set-up page.
 */
export async function uploadInBrowser(page: Page, { file, title, site = "Bench B" }: { file: string | { name: string; mimeType: string; buffer: Buffer }; title: string; site?: string }): Promise<void> {
  await page.goto(url("/captures/new"));
  const value = await page.locator("#cap-site option", { hasText: site }).getAttribute("value");
  await page.selectOption("#cap-site", value!);
  await page.setInputFiles("[data-testid=file-input]", typeof file === "string" ? path.resolve(file) : file);
  await page.fill("#cap-title", title);
  await page.click("button[type=submit]");
  await page.waitForURL(/\/captures\/[0-9a-f-]{36}\/setup$/);
}
