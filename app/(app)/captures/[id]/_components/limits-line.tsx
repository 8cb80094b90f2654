import { limitsLine, type LimitsLineInput } from "@/lib/reports/limits-line";

/** One line under the sheet header: the limits used and whether they were verified against the printed edition. */
export function LimitsLine(props: LimitsLineInput) {
  const line = limitsLine(props);
  return (
    <p
      className={`rounded-md border px-4 py-2 text-sm ${line.verified ? "border-pass/30 bg-pass-light text-pass" : "border-caution/40 bg-caution-light font-semibold text-caution"}`}
      role={line.verified ? undefined : "status"}
      data-testid="limits-line"
      data-verified={line.verified ? "true" : "false"}
    >
      {line.verified ? null : <span aria-hidden>⚠ </span>}
      {line.text}
    </p>
  );
}
