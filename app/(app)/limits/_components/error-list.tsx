// A summary of every validation message, each naming its band, row and field.
export function ErrorList({ messages, testId = "form-errors" }: { messages: string[]; testId?: string }) {
  if (messages.length === 0) return null;
  return (
    <div className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert" data-testid={testId}>
      <p className="font-medium">
        {messages.length === 1 ? "1 problem needs attention:" : `${messages.length} problems need attention:`}
      </p>
      <ul className="mt-1 list-disc space-y-0.5 pl-5">
        {messages.map((m, i) => (
          <li key={i} className="break-words">{m}</li>
        ))}
      </ul>
    </div>
  );
}
