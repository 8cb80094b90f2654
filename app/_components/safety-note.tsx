import { safetyText } from "@/lib/reports/safety-text";

// The caution shown wherever results may feed decisions about electrical equipment.
export function SafetyNote({ compact = false }: { compact?: boolean }) {
  return (
    <p className={compact ? "text-2xs text-ink-muted" : "text-xs text-ink-muted"} data-testid="safety-note">
      {safetyText}
    </p>
  );
}

/** The page footer carrying the compact caution (signed-in pages and the shared sheet). */
export function SafetyFooter() {
  return (
    <footer className="border-t border-line">
      <div className="mx-auto max-w-6xl px-4 py-3">
        <SafetyNote compact />
      </div>
    </footer>
  );
}
