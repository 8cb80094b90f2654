import { describe, expect, it } from "vitest";
import { cookieSecure } from "@/lib/auth/cookie-secure";

// Browsers send a `Secure` cookie only over https (RFC 6265 §4.1.2.5), so it must be set whenever the app is
// served over https and may be left off for a local http setup.
describe("cookieSecure", () => {
  it("is set for an https APP_URL, whatever the letter case", () => {
    expect(cookieSecure("https://ordwise.example")).toBe(true);
    expect(cookieSecure("HTTPS://Ordwise.Example:8443/app")).toBe(true);
  });
  it("is off for http, and for an unset or unparsable APP_URL", () => {
    expect(cookieSecure("http://127.0.0.1:3000")).toBe(false);
    expect(cookieSecure(undefined)).toBe(false);
    expect(cookieSecure("not a url")).toBe(false);
  });
});
