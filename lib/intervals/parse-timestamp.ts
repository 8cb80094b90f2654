import type { TimestampFormat } from "./types";

const ISO = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i;
const DMY = /^(\d{1,2})\.(\d{1,2})\.(\d{4})[ T](\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?$/;

/** The accepted formats, for error messages. */
export const TIMESTAMP_FORMATS_TEXT = "YYYY-MM-DDTHH:MM[:SS[.fff]][Z|±HH:MM] (ISO 8601), YYYY-MM-DD HH:MM[:SS], DD.MM.YYYY HH:MM[:SS]";

/**
 * Parse a logger timestamp to ms since the epoch, or null when it is not one of the accepted
 * formats or not a real date/time. Accepted: ISO 8601 `YYYY-MM-DDTHH:MM[:SS[.fff]]` with optional
 * `Z`/`±HH:MM` (`iso`), the same with a space (`ymd`), and `DD.MM.YYYY HH:MM[:SS[.fff]]` (`dmy`).
 * Timestamps without a zone are read as wall-clock time `utcOffsetMinutes` east of UTC (default
 * 0) — pure and independent of the machine's time zone.
 *
 * Complexity O(length). Never throws.
 *
 * @example
 * parseTimestamp("04.03.2024 12:10:00", "dmy") // Date.UTC(2024, 2, 4, 12, 10)
 * parseTimestamp("2024-03-04T12:10:00+01:00") // Date.UTC(2024, 2, 4, 11, 10)
 */
export function parseTimestamp(text: string, format: TimestampFormat = "auto", utcOffsetMinutes = 0): number | null {
  const trimmed = text.trim();
  let parts: { y: number; mo: number; d: number; h: number; mi: number; s: number; frac: string; zone?: string } | null = null;
  if (format !== "dmy") {
    const m = ISO.exec(trimmed);
    const spaceOk = format !== "iso" || trimmed.includes("T") || trimmed.includes("t");
    if (m && spaceOk && !(format === "ymd" && m[8])) {
      parts = { y: +m[1]!, mo: +m[2]!, d: +m[3]!, h: +m[4]!, mi: +m[5]!, s: +(m[6] ?? 0), frac: m[7] ?? "", zone: m[8] };
    }
  }
  if (!parts && (format === "dmy" || format === "auto")) {
    const m = DMY.exec(trimmed);
    if (m) parts = { y: +m[3]!, mo: +m[2]!, d: +m[1]!, h: +m[4]!, mi: +m[5]!, s: +(m[6] ?? 0), frac: m[7] ?? "" };
  }
  if (!parts) return null;
  const { y, mo, d, h, mi, s } = parts;
  if (mo < 1 || mo > 12 || d < 1 || h > 23 || mi > 59 || s > 59) return null;
  const base = Date.UTC(y, mo - 1, d, h, mi, s);
  if (new Date(base).getUTCDate() !== d) return null; // 31.02. etc.
  const ms = parts.frac ? Number(`0.${parts.frac}`) * 1000 : 0;
  let offsetMin = utcOffsetMinutes;
  if (parts.zone) {
    if (parts.zone.toUpperCase() === "Z") offsetMin = 0;
    else {
      const sign = parts.zone.startsWith("-") ? -1 : 1;
      const digits = parts.zone.slice(1).replace(":", "");
      offsetMin = sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4)));
    }
  }
  return base + ms - offsetMin * 60_000;
}
