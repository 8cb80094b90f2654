import path from "node:path";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, openSignedIn, snap, url } from "../support/browser";
import { demoCaptureId, finishedCapture } from "../support/captures";
import { signedIn } from "../support/http";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("a technician uploads a capture in the browser", () => {
  it("picks a CSV, watches the upload, maps the channels and gets an analysed capture", async () => {
    const page = await openSignedIn(browser, "technician", { path: "/captures" });
    await page.click("[data-testid=new-capture]");
    await page.waitForURL(/\/captures\/new$/);
    const site = await page.locator("#cap-site option", { hasText: "Bench B" }).getAttribute("value");
    await page.selectOption("#cap-site", site!);
    await page.setInputFiles("[data-testid=file-input]", path.resolve("fixtures/demo/bench-b-desktop-psu.csv"));
    expect(await page.inputValue("#cap-title")).toBe("bench-b-desktop-psu");
    await page.fill("#cap-title", `Browser upload PSU ${Date.now()}`);
    await snap(page, "upload-form");
    await page.click("button[type=submit]");
    await page.waitForURL(/\/captures\/[0-9a-f-]{36}\/setup$/);

    // The preview shows the file's first lines and the detected channels.
    await page.waitForSelector("[data-testid=channel-table]");
    expect(await page.textContent("[data-testid=preview-lines]")).toContain("Time (s);U (V);I (A)");
    expect(await page.inputValue('select[aria-label^="Quantity of U"]')).toBe("voltage");
    expect(await page.inputValue('select[aria-label^="Quantity of I"]')).toBe("current");
    await page.selectOption("#m-limits", "iec-61000-3-2-class-d");
    await page.fill("#ctx-ratedPowerW", "abc");
    await page.click("[data-testid=run-analysis]");
    await page.waitForSelector("text=Some fields need attention.", { timeout: 10_000 });
    await page.fill("#ctx-ratedPowerW", "180");
    await snap(page, "mapping-form");
    await page.click("[data-testid=run-analysis]");
    await page.waitForURL(/\/captures\/[0-9a-f-]{36}$/);
    const id = new URL(page.url()).pathname.split("/")[2]!;

    expect(await finishedCapture(await signedIn("technician"), id, 30_000)).toMatchObject({ status: "done" });
    await page.reload();
    // IEC 61000-3-2:2018+A1:2020 Table 3 (Class D) at 180 W: h3 ≤ 3.4 mA/W × 180 W = 0.612 A; the PSU draws ≈ 0.69 A.
    await page.waitForSelector("[data-testid=order-row-3][data-verdict=fail]", { timeout: 15_000 });
    expect(await page.textContent("[data-testid=order-row-3]")).toContain("Fail");
    await snap(page, "sheet-after-upload");
    await page.close();
  });

  it("the captures list filters by verdict on the server", async () => {
    const page = await openSignedIn(browser, "engineer", { path: "/captures?verdict=fail" });
    const rows = page.locator("[data-testid=capture-table] tbody tr");
    expect(await rows.count()).toBeGreaterThan(0);
    for (const text of await rows.allTextContents()) expect(text).toContain("Fail");
    await snap(page, "captures-failing");
    await page.close();
  });
});

describe("an interval log's sheet", () => {
  it("draws the logged period of the worst value with its table and rule limits", async () => {
    const page = await openSignedIn(browser, "engineer");
    // Found page by page: earlier tests add captures in front of the demo ones.
    const id = await demoCaptureId(await signedIn("engineer"), "Drive 2 feeder, one week of 10-minute values");
    await page.goto(url(`/captures/${id}`));
    await page.waitForSelector("[data-testid=chart-interval-trend]");
    const options = await page.locator("[data-testid=interval-trend-select] option").allTextContents();
    expect(options).toContain("TDD");
    expect(options).toContain("h5");
    expect(await page.textContent("[data-testid=sheet-charts]")).toContain("1008 logged values");
    // TDD over the week is judged by the IEEE Std 519-2014 §5.2 weekly 95th percentile of 10-minute values.
    expect(await page.textContent("[data-testid=aggregate-TDD-decided-by]")).toMatch(/10 min/);
    await snap(page, "interval-log-sheet");
    await page.close();
  });
});
