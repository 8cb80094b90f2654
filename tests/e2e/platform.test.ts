import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, openSignedIn, snap, url } from "../support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("platform in the browser", () => {
  it("an admin signs in, creates a site (with a field error first) and signs out", async () => {
    const page = await openSignedIn(browser, "admin", { path: "/sites/new" });
    await page.fill("#site-name", "Tamsin Reach Substation Feeder 2");
    await page.fill("#site-nominalVoltageV", "not a number");
    await page.click("button[type=submit]");
    await page.getByText("Nominal voltage must be a number").waitFor({ timeout: 10_000 });
    await page.fill("#site-nominalVoltageV", "400");
    await page.fill("#site-iscA", "12000");
    await page.fill("#site-ilA", "400");
    await page.click("button[type=submit]");
    await page.waitForURL(/\/sites\/[0-9a-f-]{36}$/);
    expect(await page.textContent("[data-testid=site-title]")).toBe("Tamsin Reach Substation Feeder 2");
    expect(await page.textContent("main")).toContain("Isc/IL = 30.0");
    expect(await page.textContent("[data-testid=site-captures]")).toContain("None yet.");
    expect(await page.getAttribute("text=New capture here", "href")).toMatch(/^\/captures\/new\?site=[0-9a-f-]{36}$/);
    await snap(page, "site-created");
    await page.click("[data-testid=sign-out]");
    await page.waitForURL(/\/sign-in$/);
    await page.goto(url("/sites"));
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await page.close();
  });

  it("a viewer cannot reach admin pages and sees no admin navigation", async () => {
    const page = await openSignedIn(browser, "viewer");
    expect(await page.locator("nav a", { hasText: "Users" }).count()).toBe(0);
    const res = await page.goto(url("/admin/users"));
    expect(res?.status()).toBe(403);
    // Waits for the 403 page to render (isVisible does not wait).
    await page.waitForSelector("[data-testid=forbidden]", { timeout: 10_000 });
    await page.close();
  });

  it("works at phone width", async () => {
    const page = await openSignedIn(browser, "engineer", { path: "/sites", viewport: { width: 375, height: 740 } });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await snap(page, "sites-phone");
    await page.close();
  });
});
