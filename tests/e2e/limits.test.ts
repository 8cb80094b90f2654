// The limit-table editor in the browser: an admin clones Class A, edits a cell with a reason and
// sees the diff in the history; an engineer sees the new value but cannot edit.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, openSignedIn, snap, url } from "../support/browser";

let browser: Browser;
// A fresh custom copy per run, so this file never clashes with other tests editing Class A.
const key = `e2e-class-a-${Date.now().toString(36)}`;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** Page object for /limits/<key>/edit. */
class EditorPage {
  constructor(readonly page: Page) {}
  value(band: number, row: number) {
    return this.page.locator(`[data-testid=b${band}-r${row}-value]`);
  }
  rowErrors(band: number, row: number) {
    return this.page.locator(`[data-testid=errors-b${band}-r${row}-row]`);
  }
  async save() {
    await this.page.click("[data-testid=save-revision]");
  }
}

async function overflowPx(page: Page): Promise<number> {
  return page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
}

describe("limit tables in the browser", () => {
  it("an admin clones Class A, edits a cell with a reason, and the history shows the change", async () => {
    const page = await openSignedIn(browser, "admin", { path: "/limits" });
    await page.click("[data-testid=limit-set-iec-61000-3-2-class-a] a");
    await page.waitForURL(/\/limits\/iec-61000-3-2-class-a$/);
    await page.fill("#clone-key", key);
    await page.fill("#clone-name", "Class A — e2e utility copy");
    await page.click("[data-testid=clone-submit]");
    await page.waitForURL(new RegExp(`/limits/${key}$`));
    expect(await page.textContent("[data-testid=limit-set-title]")).toBe("Class A — e2e utility copy");
    expect(await page.textContent("[data-testid=cell-0-1-limit]")).toBe("1.14");

    await page.click("[data-testid=edit-link]");
    await page.waitForURL(new RegExp(`/limits/${key}/edit$`));
    const editor = new EditorPage(page);

    // An invalid formula is reported inline on its row, naming band, row and field.
    await editor.value(0, 6).fill("0.15*15/h)");
    await expect(editor.rowErrors(0, 6).textContent()).resolves.toContain(`Band 'Class A', row 7: formula: unexpected ")" at position 10`);
    await editor.value(0, 6).fill("0.15*15/h");
    expect(await editor.rowErrors(0, 6).count()).toBe(0);

    // Order 5 (row 2) from 1.14 A to 1.05 A; saving without a reason is refused first.
    await editor.value(0, 1).fill("1.05");
    await editor.save();
    await expect(page.locator("[data-testid=editor-errors]").textContent()).resolves.toContain("Give a reason");
    expect(new URL(page.url()).pathname).toBe(`/limits/${key}/edit`);
    await snap(page, "limits-edit-errors");
    await page.fill("[data-testid=revision-reason-input]", "Utility connection agreement: order 5 at 1.05 A");
    await editor.save();
    await page.waitForURL(new RegExp(`/limits/${key}/revisions$`));

    const rev2 = page.locator("[data-testid=revision-2]");
    await rev2.waitFor();
    expect(await rev2.textContent()).toContain("current");
    expect(await rev2.locator("[data-testid=revision-reason]").textContent()).toContain("Utility connection agreement");
    const change = await rev2.locator("[data-testid=change]").allTextContents();
    expect(change).toHaveLength(1);
    expect(change[0]).toContain("Band 'Class A', row 2 (h 5)");
    expect(change[0]).toContain("limit");
    expect(change[0]).toContain("1.14");
    expect(change[0]).toContain("1.05");
    await snap(page, "limits-history");

    // Revision 1 is still there, read-only, with the old value.
    await page.click("[data-testid=revision-1] a");
    await page.waitForURL(new RegExp(`/limits/${key}/revisions/1$`));
    expect(await page.textContent("[data-testid=cell-0-1-limit]")).toBe("1.14");
    expect(await page.textContent("[data-testid=revision-banner]")).toContain("read-only");
    await page.close();
  });

  it("an admin's JSON edit is checked by the same schema, with the error path shown; the form fits a phone", async () => {
    const page = await openSignedIn(browser, "admin", { path: `/limits/${key}/edit` });
    await page.click("[data-testid=json-toggle]");
    const json = await page.inputValue("[data-testid=json-editor]");
    expect(json).toContain('"label": "Class A"');
    await page.fill("[data-testid=json-editor]", json.replace('"0.15*15/h"', '"0.15*15/n"'));
    await expect(page.locator("[data-testid=json-errors]").textContent()).resolves.toContain(`Band 'Class A', row 7: formula: unknown identifier "n"`);
    await page.fill("[data-testid=json-editor]", json.slice(0, 40));
    await expect(page.locator("[data-testid=json-errors]").textContent()).resolves.toContain("JSON:");
    await snap(page, "limits-json-errors");
    await page.close();

    const phone = await openSignedIn(browser, "admin", { path: `/limits/${key}/edit`, viewport: { width: 375, height: 740 } });
    await phone.locator("[data-testid=b0-r1-value]").waitFor();
    expect(await overflowPx(phone)).toBeLessThanOrEqual(0);
    await snap(phone, "limits-edit-phone");
    await phone.close();
  });

  it("an engineer sees the changed value but no edit button, and the editor is 403", async () => {
    const page = await openSignedIn(browser, "engineer", { path: `/limits/${key}`, viewport: { width: 375, height: 740 } });
    expect(await page.textContent("[data-testid=cell-0-1-limit]")).toBe("1.05");
    expect(await page.textContent("[data-testid=current-revision-number]")).toBe("2");
    expect(await page.locator("[data-testid=edit-link]").count()).toBe(0);
    expect(await page.locator("[data-testid=clone-form]").count()).toBe(0);
    expect(await overflowPx(page)).toBeLessThanOrEqual(0);
    await snap(page, "limits-set-phone");
    await page.goto(url("/limits"));
    expect(await page.locator("[data-testid=import-form]").count()).toBe(0);
    expect(await overflowPx(page)).toBeLessThanOrEqual(0);
    await snap(page, "limits-list-phone");
    await page.goto(url(`/limits/${key}/revisions`));
    expect(await overflowPx(page)).toBeLessThanOrEqual(0);
    await snap(page, "limits-history-phone");
    const res = await page.goto(url(`/limits/${key}/edit`));
    expect(res?.status()).toBe(403);
    // Waits for the 403 page to render (isVisible does not wait).
    await page.waitForSelector("[data-testid=forbidden]", { timeout: 10_000 });
    await page.close();
  });

  it("the limit-table screens show the set's interpretation notes: read-only for a viewer, edited by an admin as a new revision", async () => {
    const viewer = await openSignedIn(browser, "viewer", { path: "/limits/ieee-519-2014-current", viewport: { width: 375, height: 740 } });
    // One of the seeded IEEE 519 notes (the Isc/IL boundary choice), in plain words.
    expect(await viewer.textContent("[data-testid=limit-set-notes]")).toContain("Isc/IL exactly on a row boundary");
    expect(await viewer.locator("[data-testid=notes-editor]").count()).toBe(0);
    expect(await viewer.locator("[data-testid=edit-link]").count()).toBe(0);
    expect(await overflowPx(viewer)).toBeLessThanOrEqual(0);
    await snap(viewer, "limits-notes-viewer-phone");
    await viewer.close();

    const page = await openSignedIn(browser, "admin", { path: `/limits/${key}/edit` });
    const notes = page.locator("[data-testid=notes-editor]");
    await notes.waitFor();
    const before = await notes.inputValue();
    const added = "Order 5 follows the utility's connection agreement (1.05 A), not the printed table.";
    await notes.fill(`${before}\n\n${added}\n`);
    await page.fill("[data-testid=revision-reason-input]", "Note the utility's order 5 figure");
    await page.click("[data-testid=save-revision]");
    await page.waitForURL(new RegExp(`/limits/${key}/revisions$`));
    const rev3 = page.locator("[data-testid=revision-3]");
    await rev3.waitFor();
    expect(await rev3.locator("[data-testid=change]").allTextContents()).toEqual([expect.stringContaining("notes")]);
    await page.goto(url(`/limits/${key}`));
    const shown = await page.locator("[data-testid=limit-set-notes] li").allTextContents();
    // The earlier notes stay as they were, the blank line is dropped, the new note is the last.
    expect(shown.at(-1)).toBe(added);
    expect(shown.length).toBe(before.split("\n").filter((l) => l.trim() !== "").length + 1);
    await page.close();
  });
});
