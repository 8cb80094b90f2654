import { safetyText } from "@/lib/reports/safety-text";

// The caution shown wherever results may feed decisions about electrical equipment.
export function SafetyNote({ compact = false }: { compact?: boolean }) {
  return (
    <p className={compact ? "text-2xs text-ink-muted" : "text-xs text-ink-muted"} data-testid="safety-note">
      {safetyText}
    </p>
  );
}
