// Issue 9 §5: the mapping form lists every column of the file with a quantity choice. A file headed
// time,v_load,i_load used to show no channel table and answer "Include at least one channel".
import { readFileSync } from "node:fs";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, openSignedIn, snap, uploadInBrowser } from "../support/browser";
import { finishedCapture } from "../support/captures";
import { signedIn } from "../support/http";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("the mapping form lists every column", () => {
  it("time,v_load,i_load: three rows, the suggestion pre-selected, a sensor rating read, analysed", async () => {
    const page = await openSignedIn(browser, "technician");
    await uploadInBrowser(page, { file: "fixtures/snake-case-names.csv", title: `Snake-case columns ${Date.now()}` });

    await page.waitForSelector("[data-testid=channel-table]");
    expect(await page.locator("[data-testid=channel-table] tbody tr").count()).toBe(3);
    expect(await page.inputValue('select[aria-label="Quantity of time"]')).toBe("time");
    expect(await page.inputValue('select[aria-label="Quantity of v_load"]')).toBe("voltage");
    expect(await page.inputValue('select[aria-label="Quantity of i_load"]')).toBe("current");
    expect(await page.locator("[data-testid^=not-recognised-]").count()).toBe(0);
    // The scale says what it multiplies and reads a clamp's rating.
    expect(await page.textContent("[data-testid=column-row-3]")).toContain("amperes per unit of the recorded signal");
    await page.fill('input[aria-label="Scale of i_load"]', "10 mV/A");
    expect(await page.textContent("[data-testid=scale-reading-3]")).toContain("×100");
    await page.fill('input[aria-label="Scale of i_load"]', "-1");
    await page.click("[data-testid=run-analysis]");
    await page.waitForSelector("text=a scale must be greater than zero", { timeout: 10_000 });
    await page.fill('input[aria-label="Scale of i_load"]', "1");
    await snap(page, "mapping-every-column");
    await page.click("[data-testid=run-analysis]");
    await page.waitForURL(/\/captures\/[0-9a-f-]{36}$/);
    const id = new URL(page.url()).pathname.split("/")[2]!;

    expect(await finishedCapture(await signedIn("technician"), id, 30_000)).toMatchObject({ status: "done" });
    await page.close();
  });

  it("an unrecognised column is shown and can be chosen", async () => {
    const page = await openSignedIn(browser, "technician");
    // Same samples, header renamed so nothing is recognised: Sample,Col B,Col C.
    const text = readFileSync("fixtures/snake-case-names.csv", "utf8").replace(/^[^\n]*/, "Sample,Col B,Col C");
    await uploadInBrowser(page, { file: { name: "unnamed-columns.csv", mimeType: "text/csv", buffer: Buffer.from(text) }, title: `Unnamed columns ${Date.now()}` });
    await page.waitForSelector("[data-testid=channel-table]");
    expect(await page.locator("[data-testid^=not-recognised-]").count()).toBe(3);
    expect(await page.textContent("[data-testid=not-recognised-1]")).toBe("not recognised — choose what it is");
    await page.click("[data-testid=run-analysis]");
    await page.waitForSelector("text=Choose Current or Voltage for at least one column", { timeout: 10_000 });
    await page.selectOption('select[aria-label="Quantity of Sample"]', "time");
    await page.selectOption('select[aria-label="Quantity of Col B"]', "voltage");
    await page.selectOption('select[aria-label="Quantity of Col C"]', "current");
    await page.click("[data-testid=run-analysis]");
    await page.waitForURL(/\/captures\/[0-9a-f-]{36}$/);
    await page.close();
  });
});
