import { notFound } from "next/navigation";
import { requirePage } from "@/lib/auth/page";
import { listCaughtMail } from "@/lib/mail/catcher";
import { formatWhen } from "@/lib/reports/format";

export const metadata = { title: "Mailbox (development)" };

// Development and test only: what the local mail catcher received.
export default async function MailboxPage() {
  await requirePage("mailbox:read");
  if (!process.env.MAIL_CATCHER_URL) notFound();
  const messages = await listCaughtMail();
  return (
    <div className="space-y-4">
      <h1>Mailbox</h1>
      <p className="text-sm text-ink-muted">Messages caught by the local SMTP catcher. Nothing here left this machine.</p>
      {messages.length === 0 && <p className="panel text-sm">No messages yet.</p>}
      <ul className="space-y-3" data-testid="mailbox">
        {messages.map((m) => (
          <li key={m.id} className="panel">
            <p className="font-medium">{m.subject}</p>
            <p className="text-xs text-ink-muted">
              to {m.to.join(", ")} · {formatWhen(m.receivedAt)}
            </p>
            <pre className="mt-2 whitespace-pre-wrap break-words font-mono text-xs">{m.text}</pre>
          </li>
        ))}
      </ul>
    </div>
  );
}
