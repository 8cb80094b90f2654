import { SubmitButton } from "@/app/_components/submit-button";

/** The submit line both set-up forms end with: the form's message, then the button (`label`; "Starting…" while busy, disabled until `ready`). */
export function SetupSubmit({ message, busy, ready, label }: { message: string | null; busy: boolean; ready: boolean; label: string }) {
  return (
    <>
      {message && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{message}</p>}
      <SubmitButton busy={busy} busyLabel="Starting…" disabled={!ready} testId="run-analysis">
        {label}
      </SubmitButton>
    </>
  );
}
