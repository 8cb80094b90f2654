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

/** Saves a screenshot under the test data dir for a person to look at. */
export async function snap(page: Page, name: string): Promise<void> {
  const dir = path.join(process.env.TEST_DATA_DIR ?? os.tmpdir(), "screenshots");
  fs.mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}

export const url = (p: string) => new URL(p, appUrl()).toString();
