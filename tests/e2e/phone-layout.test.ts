// At 390 px (a phone) the admin's users page, the top navigation and the captures list are read
// without sideways scrolling: every user's e-mail and buttons, every navigation link and every
// capture's verdict and review state lie inside the screen.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, signInAs, snap, url } from "../support/browser";

let browser: Browser;
let page: Page;
const width = 390;

beforeAll(async () => {
  browser = await launchBrowser();
  page = await browser.newPage({ viewport: { width, height: 844 } });
  await signInAs(page, "admin");
});
afterAll(async () => {
  await browser?.close();
});

/** Right edges (px) of the elements matching `selector` that end beyond the screen, with their text. */
async function offScreen(selector: string): Promise<string[]> {
  return page.locator(selector).evaluateAll(
    (els, w) => els.filter((el) => el.getBoundingClientRect().right > w + 0.5).map((el) => `${(el.textContent ?? "").trim().slice(0, 40)} → ${Math.round(el.getBoundingClientRect().right)} px`),
    width,
  );
}

/** Width by which the page, or any scrolling box inside it, scrolls sideways. */
async function sidewaysScroll(): Promise<number> {
  return page.evaluate(() => {
    let worst = document.documentElement.scrollWidth - document.documentElement.clientWidth;
    for (const el of document.querySelectorAll("main *")) {
      const style = getComputedStyle(el);
      if (style.overflowX === "auto" || style.overflowX === "scroll") worst = Math.max(worst, el.scrollWidth - el.clientWidth);
    }
    return worst;
  });
}

describe("phone width (390 px)", () => {
  it("the top navigation wraps: every link, Customers included, is on screen", async () => {
    await page.goto(url("/captures"));
    const labels = await page.locator("nav[aria-label=Main] a").allTextContents();
    expect(labels).toEqual(expect.arrayContaining(["Captures", "Sites", "Limit tables", "Users", "Customers"]));
    expect(await offScreen("nav[aria-label=Main] a")).toEqual([]);
  });

  it("the users page shows each user as a card: e-mail, role, status and buttons on screen", async () => {
    await page.goto(url("/admin/users"));
    await page.locator("[data-testid=user-row]").first().waitFor();
    expect(await page.locator("[data-testid=user-row]").count()).toBeGreaterThanOrEqual(4);
    expect(await offScreen("[data-testid=user-row] td, [data-testid=user-row] button, [data-testid=user-row] select")).toEqual([]);
    // The e-mail reads whole on one line at this width (not broken letter by letter in a narrow column).
    const viewerEmail = page.locator("[data-testid=user-row] td", { hasText: "viewer@ordwise.test" });
    expect(await viewerEmail.evaluate((el) => el.getBoundingClientRect().width)).toBeGreaterThan(250);
    expect(await sidewaysScroll()).toBeLessThanOrEqual(0);
    await snap(page, "users-phone");
  });

  it("the captures list shows each capture as a card with its verdict and review state on screen", async () => {
    await page.goto(url("/captures"));
    await page.locator("[data-testid=capture-table] tbody tr").first().waitFor();
    expect(await offScreen("[data-testid=capture-table] tbody td")).toEqual([]);
    // The verdict sits under its column name in the card (the header row is for screen readers only here).
    expect(await page.locator("[data-testid=capture-table] thead").evaluate((el) => el.getBoundingClientRect().height)).toBeLessThanOrEqual(1);
    // Some row carries a verdict (the first may be a capture another test has just uploaded, still queued).
    const verdicts = await page.locator("[data-testid=capture-table] tbody td[data-label=Verdict]").allTextContents();
    expect(verdicts.some((text) => /Pass|Fail|Incomplete/.test(text))).toBe(true);
    expect(await sidewaysScroll()).toBeLessThanOrEqual(0);
    await snap(page, "captures-phone");
  });
});
