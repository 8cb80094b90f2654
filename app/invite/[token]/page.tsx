import { findOpenInvitation } from "@/db/queries/users";
import { formatWhen } from "@/lib/reports/format";
import { AcceptForm } from "./accept-form";

export const metadata = { title: "Set your password" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = await findOpenInvitation({ token });
  return (
    <main className="mx-auto flex min-h-screen max-w-sm flex-col justify-center gap-4 px-4">
      <h1>Welcome to Ordwise</h1>
      {invitation ? (
        <>
          <p className="text-sm text-ink-soft">
            {invitation.name} ({invitation.email}) — choose a password of at least 12 characters.
          </p>
          <p className="text-sm text-ink-soft" data-testid="invite-expires">{`This link expires on ${formatWhen(invitation.expiresAt)}.`}</p>
          <AcceptForm token={token} />
        </>
      ) : (
        <p className="panel text-sm" data-testid="invite-invalid">
          This invitation link is invalid, used or expired. Ask an admin for a new one.
        </p>
      )}
    </main>
  );
}
