/**
 * A form's submit button: says `busyLabel` ("Saving…") and is disabled while the request runs, and
 * stays disabled while `disabled` (e.g. nothing to send yet).
 *
 * @example <SubmitButton busy={busy} busyLabel="Cloning…" className="btn-quiet" testId="clone-submit">Clone</SubmitButton>
 */
export function SubmitButton({
  busy,
  busyLabel,
  className = "btn-primary",
  disabled = false,
  testId,
  children,
}: {
  busy: boolean;
  busyLabel: string;
  className?: string;
  disabled?: boolean;
  testId?: string;
  children: React.ReactNode;
}) {
  return (
    <button type="submit" className={className} disabled={busy || disabled} data-testid={testId}>
      {busy ? busyLabel : children}
    </button>
  );
}
