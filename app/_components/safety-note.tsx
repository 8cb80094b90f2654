// The caution shown wherever results may feed decisions about electrical equipment.
export function SafetyNote({ compact = false }: { compact?: boolean }) {
  return (
    <p className={compact ? "text-2xs text-ink-muted" : "text-xs text-ink-muted"} data-testid="safety-note">
      Ordwise results support, and do not replace, the judgement of a qualified engineer. Local electrical codes,
      the utility&apos;s interconnection requirements and licensed practice take precedence. Work on energised
      equipment only under your site&apos;s safety rules.
    </p>
  );
}
