// Contrast of the palette (tailwind.config.ts) where text is small: muted text, captions and table
// headers on the page and on panels, the verdict badges (Pass and "Below threshold" included), and the
// focus ring. Relative luminance and contrast ratio as defined in WCAG 2.1 (W3C Recommendation, 2018),
// "relative luminance" and "contrast ratio"; thresholds: SC 1.4.3 (4.5:1 for text), SC 1.4.11 (3:1 for
// the focus indicator, a user-interface component).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, test } from "vitest";
import config from "@/tailwind.config";

const root = path.resolve(__dirname, "../../..");
type Shades = Record<string, string>;
const colours = config.theme!.extend!.colors as Record<string, Shades>;

/** A palette colour by its class name: "ink-muted" → ink.muted, "paper" → paper.DEFAULT. */
function hex(name: string): string {
  const [family, shade = "DEFAULT"] = name.split("-") as [string, string?];
  const value = colours[family]?.[shade];
  if (!value) throw new Error(`no colour ${name} in tailwind.config.ts`);
  return value;
}

/** WCAG 2.1 relative luminance of an sRGB colour "#rrggbb". */
function luminance(colour: string): number {
  const channel = (i: number) => {
    const c = parseInt(colour.slice(1 + 2 * i, 3 + 2 * i), 16) / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel(0) + 0.7152 * channel(1) + 0.0722 * channel(2);
}

/** WCAG 2.1 contrast ratio (L1 + 0.05) / (L2 + 0.05), lighter over darker. */
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}

const read = (file: string) => fs.readFileSync(path.join(root, file), "utf8");

describe("contrast (WCAG 2.1)", () => {
  test("the formula: black on white is 21:1 (analytic); #767676 on white is 4.54:1 (from memory, the lightest grey usually quoted as meeting 4.5:1)", () => {
    expect(contrast("#000000", "#ffffff")).toBeCloseTo(21, 9);
    expect(contrast("#767676", "#ffffff")).toBeCloseTo(4.54, 2);
  });

  // Both backgrounds: the page (paper) and the panels (paper-raised); paper-sunk is where loading
  // placeholders and the "Not evaluated" badge sit.
  const backgrounds = ["paper", "paper-raised", "paper-sunk"];
  for (const text of ["ink-muted", "ink-soft"]) {
    for (const background of backgrounds) {
      test(`${text} (muted text, captions, table headers) on ${background} ≥ 4.5:1`, () => {
        expect(contrast(hex(text), hex(background))).toBeGreaterThanOrEqual(4.5);
      });
    }
  }

  const badges: Array<[string, string, string]> = [
    ["Pass", "pass", "pass-light"],
    ["Below threshold", "idle", "idle-light"],
    ["Fail", "fail", "fail-light"],
    ["Incomplete", "caution", "caution-light"],
    ["Not evaluated", "ink-muted", "paper-sunk"],
  ];
  for (const [label, text, background] of badges) {
    test(`the ${label} badge (text-${text} on bg-${background}) ≥ 4.5:1`, () => {
      expect(contrast(hex(text), hex(background))).toBeGreaterThanOrEqual(4.5);
    });
  }

  test("the badges and table headers use exactly those pairs", () => {
    const badge = read("app/_components/verdict-badge.tsx");
    for (const [, text, background] of badges) expect(badge).toContain(`bg-${background} text-${text}`);
    const css = read("app/globals.css");
    expect(css).toMatch(/\.table-base th \{[^}]*text-ink-muted/);
  });

  test("the focus ring (copper, 2 px) stands out ≥ 3:1 from the page and the panels, for links, buttons and form fields", () => {
    for (const background of backgrounds) expect(contrast(hex("copper"), hex(background))).toBeGreaterThanOrEqual(3);
    const css = read("app/globals.css");
    expect(css).toMatch(/:focus-visible \{\s*outline: 2px solid #b4582a;/);
    expect(hex("copper")).toBe("#b4582a");
    // Form fields draw their ring in copper too (not a pale tint that would disappear on white).
    expect(css).toMatch(/\.field-input \{[^}]*focus:ring-2 focus:ring-copper[ ;]/);
  });
});
