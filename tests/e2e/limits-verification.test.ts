// The limits line on the sheet and in the PDF: a visible warning while the revision is unverified, and the
// verifier's line once an admin records a check against the printed edition.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, openSignedIn, snap } from "../support/browser";
import { signedIn } from "../support/http";
import { demoCaptureId, json } from "../support/captures";
import { pdfText } from "../unit/reports/pdf-text";

const flat = (pdf: Buffer) => pdfText(pdf).replace(/\s*\n\s*/g, " ");

let browser: Browser;
let captureId = "";
let revisionNumber = 0;
let limitSetKey = "";

beforeAll(async () => {
  browser = await launchBrowser();
  const engineer = await signedIn("engineer");
  // A demo capture judged against IEC 61000-3-2 Class D (the desktop power supply).
  captureId = await demoCaptureId(engineer, "Desktop power supply, 180 W rated");
  const { evaluations } = await json<{ evaluations: { limitSetKey: string; revisionNumber: number }[] }>(
    await engineer.request("GET", `/api/captures/${captureId}/evaluations`),
  );
  limitSetKey = evaluations[0]!.limitSetKey;
  revisionNumber = evaluations[0]!.revisionNumber;
}, 60_000);
afterAll(async () => {
  await browser?.close();
});

describe("limits line", () => {
  it("warns while unverified, then shows who verified it against the printed edition, on the sheet and in the PDF", async () => {
    const engineer = await signedIn("engineer");
    const page = await openSignedIn(browser, "engineer", { path: `/captures/${captureId}`, viewport: { width: 1280, height: 900 } });
    const line = page.locator("[data-testid=limits-line]");
    await line.waitFor({ timeout: 15_000 });
    expect(await line.getAttribute("data-verified")).toBe("false");
    expect(await line.textContent()).toContain(`revision ${revisionNumber} — not yet verified against the printed standard`);
    expect(await line.isVisible()).toBe(true);
    await snap(page, "limits-line-unverified", { fullPage: false });
    const before = flat(Buffer.from(await (await engineer.request("GET", `/api/captures/${captureId}/report`)).arrayBuffer()));
    expect(before).toContain("not yet verified against the printed standard");

    // An engineer may not record a verification; an admin may, in the limit-table screen.
    expect((await engineer.request("POST", `/api/limit-sets/${limitSetKey}/revisions/${revisionNumber}/verifications`, { edition: "x", checked: "y", verifiedOn: "2026-12-03" })).status).toBe(403);
    const admin = await openSignedIn(browser, "admin", { path: `/limits/${limitSetKey}/revisions/${revisionNumber}`, viewport: { width: 1280, height: 900 } });
    expect(await admin.getAttribute("[data-testid=verification-state]", "data-verified")).toBe("false");
    await admin.fill("#verify-edition", "IEC 61000-3-2:2018");
    await admin.fill("#verify-checked", "Table 3");
    await admin.fill("#verify-date", "2026-12-03");
    await admin.click("[data-testid=verification-submit]");
    await admin.waitForSelector("[data-testid=verification-state][data-verified=true]", { timeout: 10_000 });
    await admin.close();

    await page.reload();
    await line.waitFor({ timeout: 15_000 });
    expect(await line.getAttribute("data-verified")).toBe("true");
    expect(await line.textContent()).toBe(`Limits: IEC 61000-3-2:2018 Table 3, revision ${revisionNumber}, verified against the printed edition by I. Marlowe on 2026-12-03`);
    await snap(page, "limits-line-verified", { fullPage: false });
    const after = flat(Buffer.from(await (await engineer.request("GET", `/api/captures/${captureId}/report`)).arrayBuffer()));
    expect(after).toContain(`Limits: IEC 61000-3-2:2018 Table 3, revision ${revisionNumber}, verified against the printed edition by I. Marlowe on 2026-12-03`);
    expect(after).not.toContain("not yet verified");
    await page.close();
  });
});
