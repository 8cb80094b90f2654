// The Content-Security-Policy in a real browser: the app's own scripts run (sign-in, the sheet's uPlot
// charts, inline styles), nothing is reported as a violation, and an injected inline script is refused.
// Also the admin's "Resend invitation" button.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, signInAs, snap, url } from "../support/browser";
import { signedIn, type CaughtMail } from "../support/http";

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
  it("the sheet's charts render with no violation, and an injected inline script does not run", async () => {
    const { page, violations, console } = await watchedPage();
    await signInAs(page, "engineer"); // the sign-in form itself needs the app's scripts
    expect(await violations()).toEqual([]);
    const api = await signedIn("engineer");
    const list = (await (await api.request("GET", "/api/captures")).json()) as { items: { id: string; kind?: string; reviewState: string }[] };
    const capture = list.items.find((c) => c.reviewState === "approved" && c.kind !== "interval-log")!;
    await page.goto(url(`/captures/${capture.id}`));
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
    // An inline style attribute set by React still applies.
    await snap(page, "csp-sheet");
    expect(await violations()).toEqual([]);
    expect(console).toEqual([]);

    // An attacker's inline script (as an HTML injection would add it) is refused by the policy.
    const ran = await page.evaluate(async () => {
      const s = document.createElement("script");
      s.textContent = "window.__injected = true";
      document.body.appendChild(s);
      await new Promise((r) => setTimeout(r, 100));
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
    const res = await fetch(new URL(`/messages?to=${encodeURIComponent(email)}`, process.env.MAIL_CATCHER_URL!));
    expect(((await res.json()) as CaughtMail[]).length).toBe(2);
    expect(await violations()).toEqual([]);
    await page.close();
  }, 60_000);
});
