// The Content-Security-Policy in a real browser: the app's own scripts run (sign-in, the sheet's uPlot
// charts, inline styles), nothing is reported as a violation, and injected markup cannot run script.
// Also the admin's "Resend invitation" button.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, signInAs, snap, url } from "../support/browser";
import { demoCaptureId } from "../support/captures";
import { caughtMail, signedIn } from "../support/http";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** A page that records every CSP violation and every console message about the policy. */
async function watchedPage(): Promise<{ page: Page; violations: () => Promise<string[]>; console: string[] }> {
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  const consoleLines: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Content-Security-Policy/i.test(m.text())) consoleLines.push(m.text());
  });
  // Init scripts are added by the browser's debugging protocol, outside the page's policy.
  await page.addInitScript(() => {
    const w = window as unknown as { __cspViolations: string[] };
    w.__cspViolations = [];
    document.addEventListener("securitypolicyviolation", (e) => w.__cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));
  });
  return {
    page,
    console: consoleLines,
    violations: () => page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations),
  };
}

describe("Content-Security-Policy in the browser", () => {
  it("the sheet's charts render with no violation, and an injected inline handler does not run", async () => {
    const { page, violations, console } = await watchedPage();
    await signInAs(page, "engineer"); // the sign-in form itself needs the app's scripts
    expect(await violations()).toEqual([]);
    const api = await signedIn("engineer");
    // An approved demo waveform record, found by title (other test files add captures in front of it).
    await page.goto(url(`/captures/${await demoCaptureId(api, "Compressor drives at full load — after filter")}`));
    for (const chart of ["chart-spectrum", "chart-waveform"]) {
      await page.waitForSelector(`[data-testid=${chart}] canvas`, { timeout: 20_000 });
      // uPlot drew something: the canvas holds non-transparent pixels.
      const painted = await page.$eval(`[data-testid=${chart}] canvas`, (c) => {
        const canvas = c as HTMLCanvasElement;
        const data = canvas.getContext("2d")!.getImageData(0, 0, canvas.width, canvas.height).data;
        let n = 0;
        for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) n++;
        return n;
      });
      expect(painted, chart).toBeGreaterThan(100);
    }
    // Inline style attributes (React's style prop, progress bars) still apply under the policy.
    const width = await page.evaluate(() => {
      document.body.insertAdjacentHTML("beforeend", '<div id="style-probe" style="width: 123px; height: 1px"></div>');
      return getComputedStyle(document.getElementById("style-probe")!).width;
    });
    expect(width).toBe("123px");
    await snap(page, "csp-sheet");
    expect(await violations()).toEqual([]);
    expect(console).toEqual([]);

    // Markup an attacker managed to inject (stored HTML with an inline handler) does not run its script.
    // ('strict-dynamic' trusts scripts the app's own code creates, but never inline handlers or markup.)
    const ran = await page.evaluate(async () => {
      document.body.insertAdjacentHTML("beforeend", '<img alt="" src="/no-such-image.png" onerror="window.__injected = true">');
      await new Promise((r) => setTimeout(r, 1000));
      return (window as unknown as { __injected?: boolean }).__injected === true;
    });
    expect(ran).toBe(false);
    expect((await violations()).some((v) => v.startsWith("script-src"))).toBe(true);
    await page.close();
  }, 90_000);

  it("an admin resends an invitation from the users page", async () => {
    const email = `resend-ui-${Date.now()}@ordwise.test`;
    const admin = await signedIn("admin");
    expect((await admin.request("POST", "/api/users", { email, name: "Resend Ui", role: "viewer" })).status).toBe(201);
    const { page, violations } = await watchedPage();
    await signInAs(page, "admin");
    await page.goto(url("/admin/users"));
    const row = page.locator("[data-testid=user-table] tr", { hasText: email });
    await row.getByRole("button", { name: "Resend invitation" }).click();
    await page.waitForSelector(`[role=status]:has-text("A new invitation was sent to ${email}")`);
    expect(await caughtMail(email)).toHaveLength(2);
    expect(await violations()).toEqual([]);
    await page.close();
  }, 60_000);
});
