// The sheet a customer reads: the headline numbers at desktop and phone width, and a viewer who sees
// only their own customer's sheets (a demo capture of another customer's site answers 404).
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, openSignedIn, signInAs, snapAt, url } from "../support/browser";
import { signedIn, type DemoRole } from "../support/http";
import { demoCaptureId } from "../support/captures";

let browser: Browser;
// The demo scenario: the after-filter capture at Quillbrook (the demo viewer's customer) is approved, and so is
// the heater controller at Bench B (another customer).
let ownId = "";
let otherId = "";

beforeAll(async () => {
  browser = await launchBrowser();
  const engineer = await signedIn("engineer");
  ownId = await demoCaptureId(engineer, "Compressor drives at full load — after filter");
  otherId = await demoCaptureId(engineer, "Heater controller, 1.8 kW");
}, 60_000);
afterAll(async () => {
  await browser?.close();
});

const viewports = { 1280: { width: 1280, height: 900 }, 390: { width: 390, height: 844 } } as const;

/** A capture's sheet as `role` sees it in a browser 1280 or 390 px wide. */
async function openSheet(id: string, width: keyof typeof viewports, role: DemoRole = "engineer"): Promise<Page> {
  return openSignedIn(browser, role, { path: `/captures/${id}`, viewport: viewports[width] });
}

/** The headline numbers sit above the per-order table. */
async function expectHeadlineAboveOrders(page: Page): Promise<void> {
  const summaryTop = await page.locator("[data-testid=headline-summary]").evaluate((el) => el.getBoundingClientRect().top);
  const tableTop = await page.locator("[data-testid=order-table]").first().evaluate((el) => el.getBoundingClientRect().top);
  expect(summaryTop).toBeLessThan(tableTop);
}

describe("headline numbers on the sheet", () => {
  it("at 1280 px: a row per phase with units in the column labels, above the per-order table", async () => {
    const page = await openSheet(ownId, 1280);
    const table = page.locator("[data-testid=headline-current-table]");
    await table.waitFor({ state: "visible", timeout: 15_000 });
    expect(await page.locator("[data-testid=headline-current-cards]").isVisible()).toBe(false);
    const headers = await table.locator("thead th").allTextContents();
    expect(headers).toEqual(["Channel", "Fundamental frequency (Hz)", "RMS (A)", "Fundamental RMS (A)", "THD h2–h50 (% of fundamental)", "TDD (% of IL = 260 A)", "Crest factor", "K-factor"]);
    // Three phase currents; TDD is stated against the IL of the evaluation (260 A in the demo), in the label.
    expect(await table.locator("tbody tr").count()).toBe(3);
    await page.locator("[data-testid=headline-voltage-table]").waitFor({ state: "visible" });
    const power = page.locator("[data-testid=headline-power-table]");
    expect(await power.textContent()).toContain("Three-phase total");
    expect(await power.textContent()).toMatch(/0\.\d{3} (lagging|leading|in phase)/);
    expect(await page.locator("[data-testid=headline-unbalance-table]").textContent()).toContain("Fundamental unbalance");
    await expectHeadlineAboveOrders(page);
    await snapAt(page, "headline-1280", "[data-testid=headline-summary]");
    await page.close();
  });

  it("at 390 px: a card per phase, no sideways scrolling", async () => {
    const page = await openSheet(ownId, 390);
    const cards = page.locator("[data-testid=headline-current-cards]");
    await cards.waitFor({ state: "visible", timeout: 15_000 });
    expect(await page.locator("[data-testid=headline-current-table]").isVisible()).toBe(false);
    expect(await cards.locator("li").count()).toBe(3);
    expect(await cards.locator("li").first().textContent()).toContain("TDD (% of IL = 260 A)");
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await snapAt(page, "headline-390", "[data-testid=headline-summary]");
    await page.close();
  });
});

describe("an interval log's headline numbers", () => {
  // The demo's week of 10-minute values (Drive 2 feeder): three currents, no voltage, no power columns.
  const logTitle = "Drive 2 feeder, one week of 10-minute values";

  it("at 1280 px: a row per channel, each column naming its statistic and unit; what the log lacks says 'not logged'", async () => {
    const logId = await demoCaptureId(await signedIn("engineer"), logTitle);
    const page = await openSheet(logId, 1280);
    const table = page.locator("[data-testid=headline-current-table]");
    await table.waitFor({ state: "visible", timeout: 15_000 });
    expect(await page.locator("[data-testid=headline-current-cards]").isVisible()).toBe(false);
    expect(await table.locator("thead th").allTextContents()).toEqual([
      "Channel",
      "RMS (A), mean",
      "RMS (A), maximum",
      "Fundamental RMS (A), mean",
      "THD (% of fundamental), 95th percentile",
      "THD (% of fundamental), maximum",
      "TDD (% of IL = 60 A), 95th percentile",
      "TDD (% of IL = 60 A), maximum",
    ]);
    expect(await table.locator("tbody tr").count()).toBe(3);
    expect(await page.textContent("[data-testid=headline-current-caption]")).toContain("1008 logged 10 min values from 2024-03-04 00:00 UTC");
    const missing = await page.locator("[data-testid=headline-not-logged-list]").innerText();
    for (const what of ["Voltages (r.m.s., THD): not logged", "Power (P, S, displacement, distortion and true power factor): not logged", "Unbalance: not logged"]) expect(missing).toContain(what);
    await expectHeadlineAboveOrders(page);
    await snapAt(page, "headline-log-1280", "[data-testid=headline-summary]");
    await page.close();
  });

  it("at 390 px: a card per channel and the 'not logged' list on screen, no sideways scrolling", async () => {
    const logId = await demoCaptureId(await signedIn("engineer"), logTitle);
    const page = await openSheet(logId, 390);
    const cards = page.locator("[data-testid=headline-current-cards]");
    await cards.waitFor({ state: "visible", timeout: 15_000 });
    expect(await cards.locator("li").count()).toBe(3);
    expect(await cards.locator("li").first().textContent()).toContain("TDD (% of IL = 60 A), 95th percentile");
    const right = await page.locator("[data-testid=headline-not-logged-list] li").evaluateAll((els) => Math.max(...els.map((el) => el.getBoundingClientRect().right)));
    expect(right).toBeLessThanOrEqual(390);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await snapAt(page, "headline-log-390", "[data-testid=headline-summary]");
    await page.close();
  });

  it("the logged period's chart reads its time axis in UTC as YYYY-MM-DD, in a US-English browser in another zone", async () => {
    const logId = await demoCaptureId(await signedIn("engineer"), logTitle);
    const context = await browser.newContext({ locale: "en-US", timezoneId: "America/Los_Angeles", viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInAs(page, "engineer");
    await page.goto(url(`/captures/${logId}`));
    await page.locator("[data-testid=chart-interval-trend] canvas").waitFor({ timeout: 20_000 });
    // uPlot draws its axis labels on the canvas, so the time is read from the legend: hovering the plot's left edge
    // shows the first logged times (2024-03-04 00:00 UTC onwards; fixtures/intervals/generate.ts).
    await page.locator("[data-testid=chart-interval-trend] .u-over").hover({ position: { x: 1, y: 60 } });
    await page.waitForFunction(() => /2024-03-0\d \d\d:\d\d UTC/.test(document.querySelector("[data-testid=chart-interval-trend] .u-legend")?.textContent ?? ""));
    expect(await page.locator("[data-testid=chart-interval-trend] .u-legend").textContent()).toContain("2024-03-04 00:");
    await context.close();
  });
});

describe("the per-order results on a phone", () => {
  it("at 390 px: a card per order with order, measured / limit, % of limit and verdict in view, details on tap; the review panel reached from the top", async () => {
    const engineer = await signedIn("engineer");
    const beforeId = await demoCaptureId(engineer, "Compressor drives at full load — before filter");
    const page = await openSheet(beforeId, 390);
    const cards = page.locator("[data-testid=order-cards]");
    await cards.waitFor({ state: "visible", timeout: 15_000 });
    expect(await page.locator("[data-testid=order-table]").isVisible()).toBe(false);
    // Failing orders first: h5 of the before-filter record, 14.62 %IL against the 7 %IL limit of IEEE Std 519-2014
    // Table 2 (20 ≤ Isc/IL < 50, 3 ≤ h < 11).
    const first = cards.locator("li").first();
    expect(await first.getAttribute("data-verdict")).toBe("fail");
    const summary = (await first.locator("summary").innerText()).replace(/\s+/g, " ");
    expect(summary).toMatch(/^h5 [\d.]+ \/ 7 %IL [\d.]+ % of the limit Fail$/);
    // Everything that carries the verdict is on screen.
    const right = await cards.locator("summary").evaluateAll((els) => Math.max(...els.map((el) => el.getBoundingClientRect().right)));
    expect(right).toBeLessThanOrEqual(390);
    await first.locator("summary").click();
    expect(await first.locator("dl").innerText()).toContain("Margin");
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await snapAt(page, "order-cards-390", "[data-testid=order-cards]");
    // The review panel sits below the sheet on a phone; a link near the top leads to it.
    await page.evaluate(() => window.scrollTo(0, 0));
    const jump = page.locator("[data-testid=review-jump] a");
    expect(await jump.evaluate((el) => el.getBoundingClientRect().top + window.scrollY)).toBeLessThan(1500);
    await jump.click();
    await page.waitForFunction(() => {
      const r = document.querySelector("[data-testid=review-panel]")?.getBoundingClientRect();
      return r !== undefined && r.top >= 0 && r.top < window.innerHeight;
    });
    await page.close();
  });
});

describe("chart values without a mouse", () => {
  it("the spectrum lists its failing orders in text, and the keyboard reaches and opens each chart's table", async () => {
    const engineer = await signedIn("engineer");
    const beforeId = await demoCaptureId(engineer, "Compressor drives at full load — before filter");
    const page = await openSheet(beforeId, 1280);
    await page.waitForSelector("[data-testid=spectrum-table]", { timeout: 20_000 });
    // The demo's before-filter record fails at least one order (the after-filter one is the fix).
    expect(await page.textContent("[data-testid=spectrum-failing]")).toMatch(/^Over the limit: h\d+ \(/);
    // Tab from the top of the page until the spectrum's "Show as table" has the focus.
    await page.locator("body").click({ position: { x: 5, y: 5 } });
    let reached = false;
    for (let i = 0; i < 250 && !reached; i++) {
      await page.keyboard.press("Tab");
      reached = await page.evaluate(() => document.activeElement?.closest("[data-testid=spectrum-table]") !== null && document.activeElement?.tagName === "SUMMARY");
    }
    expect(reached).toBe(true);
    // A visible focus ring on the focused control.
    expect(await page.evaluate(() => getComputedStyle(document.activeElement!).outlineStyle)).toBe("solid");
    await page.keyboard.press("Enter");
    const table = page.locator("[data-testid=spectrum-table] table");
    await table.waitFor({ state: "visible" });
    expect(await table.locator("tbody tr").first().textContent()).toContain("h1");
    expect(await page.locator("[data-testid=spectrum-table] tbody tr").count()).toBeGreaterThan(10);
    for (const id of ["waveform-table", "trend-table", "order-trend-table"]) expect(await page.locator(`[data-testid=${id}] summary`).count()).toBe(1);
    await snapAt(page, "chart-table-keyboard", "[data-testid=spectrum-table]");
    await page.close();
  });
});

describe("compare two captures", () => {
  it("draws both spectra with their limits and hides orders below threshold in both on request", async () => {
    const engineer = await signedIn("engineer");
    const psu = await demoCaptureId(engineer, "Desktop power supply, 180 W rated");
    const page = await openSignedIn(browser, "engineer", { path: `/captures/compare?a=${psu}&b=${otherId}`, viewport: { width: 1280, height: 900 } });
    await page.waitForSelector("[data-testid=compare-spectrum] svg", { timeout: 15_000 });
    expect(await page.locator("[data-testid=compare-spectrum] rect").count()).toBeGreaterThan(10);
    const before = await page.locator("[data-testid=compare-table] tbody tr").count();
    await page.click("[data-testid=compare-hide-below]");
    await page.waitForURL(/hide=below-threshold/);
    const after = await page.locator("[data-testid=compare-table] tbody tr").count();
    expect(after).toBeLessThan(before);
    expect(await page.textContent("main")).toContain(`${before - after} order`);
    await snapAt(page, "compare-spectrum", "[data-testid=compare-spectrum]");
    await page.close();
  });
});

describe("a viewer sees only their own customer's sheets", () => {
  it("reads the approved sheet of her customer's site, without review comments, and gets 404 for another customer's", async () => {
    const page = await openSheet(ownId, 1280, "viewer");
    await page.locator("[data-testid=headline-summary]").waitFor({ timeout: 15_000 });
    expect(await page.textContent("main")).not.toContain("Approved for the utility submission");
    await page.goto(url("/captures"));
    const list = (await page.textContent("main")) ?? "";
    expect(list).toContain("Compressor drives at full load — after filter");
    expect(list).not.toContain("Heater controller");
    const res = await page.goto(url(`/captures/${otherId}`));
    expect(res?.status()).toBe(404);
    await snapAt(page, "viewer-other-customer-404", "body");
    await page.goto(url("/sites"));
    const sites = (await page.textContent("main")) ?? "";
    expect(sites).toContain("Quillbrook");
    expect(sites).not.toContain("Bench B");
    expect(sites).not.toContain("Harrowgate");
    await page.close();
  });
});
