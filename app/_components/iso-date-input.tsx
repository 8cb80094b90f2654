/**
 * A date field in the product's one date format, YYYY-MM-DD, whatever the browser's locale (a native
 * date picker shows the locale's format). The label names the format, the field checks it before
 * submitting, and an error (the server's, naming the problem) is tied to the field for screen readers.
 */
export function IsoDateInput({
  id,
  name,
  label,
  defaultValue,
  error,
  testId,
}: {
  id: string;
  name: string;
  label: string;
  defaultValue?: string;
  error?: string | null;
  testId?: string;
}) {
  const errorId = `${id}-error`;
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label} <span className="font-normal text-ink-soft">(YYYY-MM-DD)</span>
      </label>
      <input
        id={id}
        name={name}
        type="text"
        inputMode="numeric"
        autoComplete="off"
        placeholder="YYYY-MM-DD"
        pattern="\d{4}-\d{2}-\d{2}"
        maxLength={10}
        title="A date as YYYY-MM-DD, e.g. 2026-03-04"
        defaultValue={defaultValue ?? ""}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        className="field-input tabular-nums"
        data-testid={testId}
      />
      {error && (
        <p id={errorId} className="field-error">
          {error}
        </p>
      )}
    </div>
  );
}
