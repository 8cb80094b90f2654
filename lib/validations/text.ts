import { z } from "zod";

// C0 controls, DEL and C1 controls. Tab (U+0009), line feed (U+000A) and carriage return (U+000D) are
// allowed only where a field is multi-line.
const anyControl = /[\u0000-\u001F\u007F-\u009F]/;
const controlExceptLineBreaks = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/;

function codePoint(ch: string): string {
  return `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, "0")}`;
}

/**
 * Why `text` cannot be stored as typed, or null: it holds a control character (a NUL, escape …); a
 * single-line field also refuses tab and line breaks.
 *
 * @example controlCharacterProblem("a\u0000b", { multiLine: true }) // "Contains a control character (U+0000)"
 */
export function controlCharacterProblem(text: string, { multiLine }: { multiLine: boolean }): string | null {
  const m = (multiLine ? controlExceptLineBreaks : anyControl).exec(text);
  if (!m) return null;
  const ch = m[0];
  if (!multiLine && (ch === "\t" || ch === "\n" || ch === "\r")) return "Must be a single line (no tabs or line breaks)";
  return `Contains a control character (${codePoint(ch)})`;
}

type StringParams = Parameters<typeof z.string>[0];

/** A one-line text field: no control characters at all. `params` as for `z.string` (e.g. the missing-value message). */
export const singleLineText = (params?: StringParams) =>
  z.string(params).superRefine((v, ctx) => {
    const problem = controlCharacterProblem(v, { multiLine: false });
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

/** A multi-line text field: tab and line breaks allowed, other control characters not. */
export const multiLineText = (params?: StringParams) =>
  z.string(params).superRefine((v, ctx) => {
    const problem = controlCharacterProblem(v, { multiLine: true });
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

const minYear = 1970;
const maxYear = 2100;
const yearProblem = `Use a date between ${minYear} and ${maxYear}`;
const inYears = (iso: string) => {
  const year = Number(iso.slice(0, 4));
  return year >= minYear && year <= maxYear;
};

/** A calendar date `YYYY-MM-DD` in the years 1970–2100. */
export const boundedIsoDate = () => z.iso.date("Give a date as YYYY-MM-DD, e.g. 2026-03-04").refine(inYears, yearProblem);

/** An ISO date-time with offset in the years 1970–2100. */
export const boundedIsoDateTime = () =>
  z.iso.datetime({ offset: true }).refine((v) => inYears(v) && Number.isFinite(Date.parse(v)), yearProblem);
