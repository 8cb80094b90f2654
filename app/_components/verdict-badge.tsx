import { verdictLabel } from "@/lib/reports/format";

// Every verdict is shown with a word and a shape as well as a colour, so it reads in grey print
// and for colour-blind readers.
const styles: Record<string, string> = {
  pass: "bg-pass-light text-pass border-pass/30",
  fail: "bg-fail-light text-fail border-fail/40",
  incomplete: "bg-caution-light text-caution border-caution/30",
  "below-threshold": "bg-idle-light text-idle border-idle/30",
  "not-evaluated": "bg-paper-sunk text-ink-muted border-line",
};

function Icon({ verdict }: { verdict: string }) {
  const common = { width: 12, height: 12, viewBox: "0 0 12 12", "aria-hidden": true, fill: "none", stroke: "currentColor", strokeWidth: 1.8, strokeLinecap: "round" as const, strokeLinejoin: "round" as const };
  switch (verdict) {
    case "pass":
      return <svg {...common}><path d="M2 6.5 4.8 9 10 3" /></svg>;
    case "fail":
      return <svg {...common}><path d="M3 3l6 6M9 3 3 9" /></svg>;
    case "incomplete":
      return <svg {...common}><path d="M6 1.5 11 10.5H1z" /><path d="M6 5v2.4M6 9.1v.1" /></svg>;
    case "below-threshold":
      return <svg {...common}><path d="M6 2v7M3 6.5 6 9.5 9 6.5" /></svg>;
    default:
      return <svg {...common}><circle cx="6" cy="6" r="4.5" /><path d="M3.5 6h5" /></svg>;
  }
}

/** A verdict as a coloured chip with an icon and its name ("Fail", "Below threshold", …). */
export function VerdictBadge({ verdict, size = "sm", testId }: { verdict: string; size?: "sm" | "lg"; testId?: string }) {
  const sizing = size === "lg" ? "px-3 py-1.5 text-base gap-2" : "px-1.5 py-0.5 text-xs gap-1";
  return (
    <span
      className={`inline-flex items-center whitespace-nowrap rounded border font-semibold ${sizing} ${styles[verdict] ?? styles["not-evaluated"]}`}
      data-testid={testId ?? "verdict"}
      data-verdict={verdict}
    >
      <Icon verdict={verdict} />
      {verdictLabel(verdict)}
    </span>
  );
}
