// The pass/fail sheet in the browser: verdicts with text, sort and filter, charts, re-evaluation,
// review with e-mail, share links (signed out, then revoked), PDF and CSV, compare, phone width.
import fs from "node:fs";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { artifactPath, launchBrowser, openSignedIn, snap, snapAt, url } from "../support/browser";
import { signedIn, waitForMail } from "../support/http";
import { pdfText } from "../unit/reports/pdf-text";
import { analysedCapture, currentCsv, demoCaptureId, json, uploadCapture } from "../support/captures";

/**
 * The records judged here (currentCsv): 20 cycles of 50 Hz at 256 samples per cycle, I1 = 10 A r.m.s.
 * plus a 3rd harmonic of `i3Rms`. With 3 A the IEC 61000-3-2:2018+A1:2020 Class A h3 limit of 2.30 A (Table 1) fails; with 1 A it passes.
 */


/** A viewport-sized screenshot with `selector` scrolled to the top, for looking at one part of a long page. */
const rowOrders = (page: Page) =>
  page.$$eval("[data-testid=order-table] tbody tr[data-testid^=order-row-]", (rows) => rows.map((r) => Number(r.getAttribute("data-testid")!.slice("order-row-".length))));

let browser: Browser;
let failingId = "";
let passingId = "";
const stamp = Date.now();
const failingTitle = `Sheet test kettle before ${stamp}`;

beforeAll(async () => {
  browser = await launchBrowser();
  const tech = await signedIn("technician");
  const { sites } = await json<{ sites: { id: string; name: string }[] }>(await tech.request("GET", "/api/sites"));
  const site = sites.find((s) => s.name.startsWith("Bench B")) ?? sites[0]!;
  failingId = await analysedCapture(tech, site.id, failingTitle, currentCsv(3));
  passingId = await analysedCapture(tech, site.id, `Sheet test kettle after filter ${stamp}`, currentCsv(1));
});
afterAll(async () => {
  await browser?.close();
});

describe("the pass/fail sheet", () => {
  it("shows failing orders with words and icons, sorts and filters, and draws the charts", async () => {
    const page = await openSignedIn(browser, "engineer", { path: `/captures/${failingId}`, viewport: { width: 1280, height: 900 } });
    expect(await page.textContent("[data-testid=sheet-verdict]")).toContain("Fail");
    expect(await page.textContent("[data-testid=sheet-revision]")).toMatch(/revision \d+/);
    expect(await page.textContent("[data-testid=sheet-limit-set]")).toContain("Class A");
    expect(await page.textContent("[data-testid=sheet-limit-set]")).not.toContain("iec-61000-3-2-class-a");
    await page.waitForSelector("[data-testid=safety-note]", { timeout: 10_000 });

    const h3 = page.locator("[data-testid=order-row-3]");
    expect(await h3.getAttribute("data-verdict")).toBe("fail");
    expect(await h3.locator("[data-testid=verdict]").textContent()).toBe("Fail");
    expect(await h3.locator("[data-testid=verdict] svg").count()).toBe(1);
    expect(await page.textContent("[data-testid=failing-count]")).toContain("1 order over the limit");
    // Below-threshold rows say why.
    expect(await page.textContent("[data-testid=row-reasons]")).toContain("disregarded");

    expect((await rowOrders(page)).slice(0, 3)).toEqual([2, 3, 4]);
    await page.click("[data-testid=failing-first]");
    expect((await rowOrders(page))[0]).toBe(3);
    await page.click("[data-testid=failing-first]");
    await page.click("[data-testid=sort-order]");
    const descending = await rowOrders(page);
    expect(descending[0]).toBeGreaterThan(descending[1]!);
    await page.click("[data-testid=sort-percentOfLimit]");
    expect((await rowOrders(page))[0]).toBe(3);
    const all = (await rowOrders(page)).length;
    await page.click("[data-testid=evaluated-only]");
    const evaluated = await page.$$eval("[data-testid=order-table] tbody tr[data-verdict]", (rows) => rows.map((r) => r.getAttribute("data-verdict")));
    expect(evaluated.length).toBeLessThan(all);
    expect(evaluated).toContain("fail");
    expect(evaluated.every((v) => v === "pass" || v === "fail")).toBe(true);

    await page.waitForSelector("[data-testid=chart-spectrum] canvas");
    await page.waitForSelector("[data-testid=chart-waveform] canvas");
    await page.waitForSelector("[data-testid=chart-trend] canvas");
    await page.click("[data-testid=spectrum-mode-percent]");
    await page.waitForSelector("[data-testid=chart-spectrum] canvas");
    await snap(page, "sheet-failing");
    await snapAt(page, "sheet-failing-top", "body");
    await snapAt(page, "sheet-failing-charts", "[data-testid=sheet-charts]");
    await snapAt(page, "sheet-failing-table", "[data-testid=order-table]");
    await page.close();
  });

  it("an engineer re-judges in another context and sees the new evaluation next to the old one", async () => {
    const page = await openSignedIn(browser, "engineer", { path: `/captures/${failingId}`, viewport: { width: 1280, height: 900 } });
    await page.selectOption("#ctx-phaseConfig", "single-phase");
    await page.fill("#ctx-ratedPowerW", "not a number");
    await page.click("[data-testid=reevaluate]");
    expect(await page.textContent("[data-testid=context-form]")).toContain("Enter a number");
    await page.fill("#ctx-ratedPowerW", "2300");
    await page.click("[data-testid=reevaluate]");
    await page.waitForURL(/evaluation=[0-9a-f-]{36}/);
    await page.waitForSelector("[data-testid=evaluation-pair]");
    expect(await page.locator("[data-testid=evaluation-item]").count()).toBeGreaterThanOrEqual(2);
    expect(await page.textContent("[data-testid=sheet-context]")).toContain("2300 W");
    expect(await page.textContent("[data-testid=sheet-context]")).toContain("single-phase");
    await snap(page, "sheet-reevaluated");
    await page.close();
  });

  it("a technician submits, the engineer sends back with a reason, the technician resubmits and an admin approves; the uploader gets the e-mail", async () => {
    const tech = await openSignedIn(browser, "technician", { path: `/captures/${failingId}` });
    expect(await tech.locator("[data-testid=review-approve]").count()).toBe(0);
    await tech.click("[data-testid=review-submit]");
    await tech.waitForFunction(() => document.querySelector("[data-testid=review-state]")?.textContent === "In review");
    await tech.close();

    const page = await openSignedIn(browser, "engineer", { path: `/captures/${failingId}` });
    await page.click("[data-testid=review-send-back]");
    expect(await page.textContent("[data-testid=review-error]")).toContain("Say why");
    await page.fill("[data-testid=review-comment]", "h3 is over; check the clamp ratio first");
    await page.click("[data-testid=review-send-back]");
    await page.waitForFunction(() => document.querySelector("[data-testid=review-state]")?.textContent === "Sent back");
    // Sent back is not approvable: the buttons follow the state machine.
    expect(await page.locator("[data-testid=review-approve]").count()).toBe(0);
    await page.close();

    const techApi = await signedIn("technician");
    expect((await techApi.request("POST", `/api/captures/${failingId}/review`, { action: "submitted", comment: "ratio checked" })).status).toBe(200);

    // The engineer re-judged this capture earlier, so by the four-eyes rule another reviewer approves.
    const adminPage = await openSignedIn(browser, "admin", { path: `/captures/${failingId}` });
    await adminPage.fill("[data-testid=review-comment]", "Ratio confirmed, excess is real");
    await adminPage.click("[data-testid=review-approve]");
    await adminPage.waitForFunction(() => document.querySelector("[data-testid=review-state]")?.textContent === "Approved");
    expect(await adminPage.textContent("[data-testid=review-state-chip]")).toContain("Approved by Ines Marlowe");
    expect(await adminPage.textContent("[data-testid=sheet-setup]")).toContain("File SHA-256");
    expect(await adminPage.locator("[data-testid=review-approve]").count()).toBe(0);
    const history = await adminPage.$$eval("[data-testid=review-event]", (els) => els.map((e) => e.getAttribute("data-action")));
    expect(history).toEqual(["submitted", "sent_back", "submitted", "approved"]);
    await snapAt(adminPage, "sheet-approved", "body");
    const mail = await waitForMail("technician@ordwise.test", { match: (m) => m.subject.includes(`"${failingTitle}" approved`) });
    expect(mail.text).toContain("Ratio confirmed");
    expect(mail.text).toContain(`/captures/${failingId}`);
    await adminPage.close();
  });

  it("downloads the PDF and the CSV with the per-order table", async () => {
    const api = await signedIn("engineer");
    const pdfRes = await api.request("GET", `/api/captures/${failingId}/report`);
    expect(pdfRes.status).toBe(200);
    expect(pdfRes.headers.get("content-type")).toBe("application/pdf");
    const pdf = Buffer.from(await pdfRes.arrayBuffer());
    expect(pdf.subarray(0, 4).toString()).toBe("%PDF");
    const text = pdfText(pdf);
    expect(text).toContain(failingTitle);
    expect(text).toMatch(/Revision \d+/);
    const lines = text.split("\n");
    const h3 = lines.indexOf("h3");
    expect(h3).toBeGreaterThan(0);
    // order, measured, limit, table limit, unit, % of limit, margin, verdict, decided by
    expect(lines.slice(h3, h3 + 9)[7]).toBe("Fail");
    expect(lines.slice(h3, h3 + 9)[2]).toBe("2.3");
    expect(lines.slice(h3, h3 + 9)[8]).toBe("capture mean");
    expect(text).toContain("qualified engineer");
    fs.writeFileSync(artifactPath("sheet-report.pdf"), pdf);

    const csvRes = await api.request("GET", `/api/captures/${failingId}/sheet-csv`);
    expect(csvRes.status).toBe(200);
    const csv = await csvRes.text();
    expect(csv).toContain(`Capture,${failingTitle}`);
    expect(csv).toMatch(/\r\n[^,\r\n]+,3,[\d.]+,2\.3,A,[\d.]+,-[\d.]+,fail,/);
  });

  it("a share link opens the read-only sheet signed out, and stops working once revoked", async () => {
    const page = await openSignedIn(browser, "engineer", { path: `/captures/${failingId}` });
    await page.fill("[data-testid=share-label]", "Utility reviewer");
    await page.fill("[data-testid=share-days]", "7");
    await page.click("[data-testid=share-create]");
    const shareUrl = await page.locator("[data-testid=share-url]").inputValue();
    expect(shareUrl).toMatch(/\/share\/[a-z2-7]+$/);
    await page.waitForSelector("[data-testid=share-item] >> text=Utility reviewer");

    const outsider = await browser.newContext();
    const shared = await outsider.newPage();
    const res = await shared.goto(shareUrl);
    expect(res?.status()).toBe(200);
    expect(await shared.textContent("[data-testid=sheet-title]")).toBe(failingTitle);
    // The page says when the link expires: 7 days from now, as YYYY-MM-DD HH:MM UTC.
    const expiry = (await shared.textContent("[data-testid=share-expiry]")) ?? "";
    const until = /works until (\d{4}-\d{2}-\d{2}) (\d{2}:\d{2}) UTC/.exec(expiry);
    expect(until).not.toBeNull();
    expect(Math.abs(Date.parse(`${until![1]}T${until![2]}:00Z`) - (Date.now() + 7 * 86_400_000))).toBeLessThan(10 * 60_000);
    expect(await shared.locator("[data-testid=order-row-3]").getAttribute("data-verdict")).toBe("fail");
    await shared.waitForSelector("[data-testid=safety-note]", { timeout: 10_000 });
    // Read-only: no actions and no way into the app.
    for (const id of ["review-panel", "share-panel", "context-form", "current-user"]) expect(await shared.locator(`[data-testid=${id}]`).count()).toBe(0);
    expect(await shared.locator("a[href^='/captures'], a[href^='/sites']").count()).toBe(0);
    await shared.waitForSelector("[data-testid=chart-spectrum] canvas");
    await snap(shared, "share-page");
    await snapAt(shared, "share-page-top", "body");
    const pdfHref = await shared.getAttribute("[data-testid=shared-pdf]", "href");
    const pdf = await fetch(new URL(pdfHref!, shareUrl));
    expect(pdf.status).toBe(200);
    const sharedText = pdfText(Buffer.from(await pdf.arrayBuffer()));
    expect(sharedText).toContain("h3");
    expect(sharedText).not.toContain("check the clamp ratio"); // review comments stay internal

    await page.click("[data-testid=share-item]:has-text('Utility reviewer') [data-testid=share-revoke]");
    await page.waitForSelector("[data-testid=share-item][data-revoked=true]");
    const after = await shared.goto(shareUrl);
    expect(after?.status()).toBe(404);
    expect(await shared.textContent("[data-testid=share-invalid]")).toContain("no longer valid");
    expect((await fetch(new URL(pdfHref!, shareUrl))).status).toBe(404);
    await outsider.close();
    await page.close();
  });

  it("compares two captures of the site order by order", async () => {
    const page = await openSignedIn(browser, "engineer", { path: `/captures/${failingId}` });
    await page.selectOption("[data-testid=compare-select]", passingId);
    await page.click("[data-testid=compare-go]");
    await page.waitForURL(/\/captures\/compare\?/);
    const row = page.locator("[data-testid=compare-row-3]");
    const cells = await row.locator("td").allTextContents();
    expect(cells[0]).toBe("h3");
    expect(cells[5]).toMatch(/^-(2|1\.9\d*)(\.\d+)? \(-6\d %\)$/); // 3 A → 1 A
    expect(cells[6]).toContain("Fail");
    expect(cells[6]).toContain("Pass");
    await snap(page, "compare");
    await page.close();
  });

  it("fits a phone: the table scrolls inside its panel, the page does not", async () => {
    const page = await openSignedIn(browser, "engineer", { path: `/captures/${failingId}`, viewport: { width: 375, height: 800 } });
    await page.waitForSelector("[data-testid=chart-spectrum] canvas");
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await snap(page, "sheet-phone");
    await snapAt(page, "sheet-phone-top", "body");
    await snapAt(page, "sheet-phone-charts", "[data-testid=sheet-charts]");
    await snapAt(page, "sheet-phone-table", "[data-testid=order-table]");
    await snapAt(page, "sheet-phone-review", "[data-testid=review-panel]");
    await page.close();
  });

  it("a failed analysis shows its reason and, to an uploader, the way back to the mapping", async () => {
    const tech = await signedIn("technician");
    const { sites } = await json<{ sites: { id: string }[] }>(await tech.request("GET", "/api/sites"));
    const csv = "Time (s),I (A)\n0,1\n0.001,2\n0.002,1\n";
    const id = await uploadCapture(tech, { siteId: sites[0]!.id, title: `Sheet test too short ${stamp}`, body: csv });
    await tech.request("POST", `/api/captures/${id}/uploaded`);
    await json(await tech.request("PUT", `/api/captures/${id}/setup`, { mapping: { channels: {} }, limitSetKey: "iec-61000-3-2-class-a", context: {} }));
    await json(await tech.request("POST", `/api/captures/${id}/analyze`));

    // Opened while queued or running, the page polls and shows the failure once it settles.
    const page = await openSignedIn(browser, "technician", { path: `/captures/${id}` });
    await page.waitForSelector("[data-testid=failure-reason]", { timeout: 30_000 });
    // 3 rows at 1 ms: 3 ms of record, where a window needs 10 cycles at 50 Hz (0.2 s). The reason stands
    // as a sentence of its own, so it starts with a capital (the engine's message starts in lower case).
    expect(await page.textContent("[data-testid=failure-reason]")).toContain("Why it failedRecord is shorter than one analysis window: 0.00300 s of data");
    expect(await page.getAttribute("[data-testid=fix-mapping]", "href")).toBe(`/captures/${id}/setup`);
    await snapAt(page, "sheet-failed", "body");
    await page.close();

    const viewerPage = await openSignedIn(browser, "engineer", { path: `/captures/${id}` });
    await viewerPage.waitForSelector("[data-testid=failure-reason]", { timeout: 10_000 });
    await viewerPage.close();
  });

  it("the interval log's trend has a keyboard-reachable table of the chosen value and its limits", async () => {
    const page = await openSignedIn(browser, "engineer");
    // Found page by page: earlier tests add captures in front of the demo ones.
    const id = await demoCaptureId(await signedIn("engineer"), "Drive 2 feeder, one week of 10-minute values");
    await page.goto(url(`/captures/${id}`));
    await page.waitForSelector("[data-testid=chart-interval-trend]");
    await page.selectOption("[data-testid=interval-trend-select]", "TDD");
    await page.focus("[data-testid=interval-trend-table] summary");
    await page.keyboard.press("Enter");
    const table = page.locator("[data-testid=interval-trend-table] table");
    await table.waitFor({ state: "visible" });
    const headers = await table.locator("thead th").allTextContents();
    expect(headers[0]).toBe("Time");
    expect(headers[1]).toMatch(/^TDD \(%IL\)/);
    expect(headers).toContain("Table limit (%IL)");
    expect(await table.locator("tbody tr").count()).toBeGreaterThan(10);
    expect(await table.locator("tbody tr th").first().textContent()).toMatch(/^\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC$/);
    await page.close();
  });

  it("a capture still being set up shows its status instead of a sheet", async () => {
    const tech = await signedIn("technician");
    const { sites } = await json<{ sites: { id: string }[] }>(await tech.request("GET", "/api/sites"));
    const { capture } = await json<{ capture: { id: string } }>(
      await tech.request("POST", "/api/captures", { siteId: sites[0]!.id, title: `Sheet test pending ${stamp}`, filename: "x.csv", sizeBytes: 10 }),
    );
    const page = await openSignedIn(browser, "technician", { path: `/captures/${capture.id}` });
    expect(await page.getAttribute("[data-testid=capture-progress]", "data-status")).toBe("uploading");
    expect(await page.locator("[data-testid=order-table]").count()).toBe(0);
    // Before analysis the kind can be switched; the uploader can withdraw it.
    await page.click("[data-testid=switch-kind]");
    await page.waitForURL(/\/setup$/);
    expect((await json<{ capture: { kind: string } }>(await tech.request("GET", `/api/captures/${capture.id}`))).capture.kind).toBe("interval-log");
    await page.goto(url(`/captures/${capture.id}`));
    page.once("dialog", (d) => void d.accept());
    await page.click("[data-testid=withdraw]");
    await page.waitForURL(/\/captures$/);
    expect((await tech.request("GET", `/api/captures/${capture.id}`)).status).toBe(404);
    await page.close();
  });
});
