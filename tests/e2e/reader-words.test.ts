// The demo sheets as a reader gets them in the browser — the signed-in sheet with every "show" opened, and
// the share page — name no internal identifier: no camelCase field names, no rule, condition or
// limit-set ids, no "snapshot", no provenance markers (the same detector as the unit walk over every
// seeded limit set, tests/unit/reports/reader-words.test.ts).
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demoCaptures } from "@/db/seed/demo-captures";
import { launchBrowser, openSignedIn } from "../support/browser";
import { demoCaptureId, json } from "../support/captures";
import { signedIn, type Client } from "../support/http";
import { internalNames } from "../support/internal-names";

let browser: Browser;
let engineer: Client;

beforeAll(async () => {
  browser = await launchBrowser();
  engineer = await signedIn("engineer");
}, 60_000);
afterAll(async () => {
  await browser?.close();
});

/** The page's visible words once every collapsed part ("Show as table", "all 4 rules", details) is open. */
async function visibleWords(page: Page, ready: string): Promise<string> {
  await page.locator(ready).first().waitFor({ timeout: 30_000 });
  // Charts, the likely source and the saved studies load after the page.
  await page.waitForLoadState("networkidle");
  await page.evaluate(() => document.querySelectorAll("details").forEach((d) => (d.open = true)));
  return page.locator("main").innerText();
}

describe("the demo sheets name no internal identifier", () => {
  for (const demo of demoCaptures) {
    it(`${demo.title}: the sheet and its share page`, async () => {
      const id = await demoCaptureId(engineer, demo.title);
      const page = await openSignedIn(browser, "engineer", { path: `/captures/${id}`, viewport: { width: 1280, height: 900 } });
      const sheet = await visibleWords(page, "[data-testid=sheet-notes]");
      expect(sheet.length).toBeGreaterThan(2000);
      expect(internalNames(sheet)).toEqual([]);

      const { url: shared } = await json<{ url: string }>(await engineer.request("POST", `/api/captures/${id}/shares`, { label: "reader words", expiresInDays: 1 }));
      await page.goto(shared);
      const share = await visibleWords(page, "[data-testid=sheet-notes]");
      expect(internalNames(share)).toEqual([]);
      await page.close();
    }, 120_000);
  }
});
