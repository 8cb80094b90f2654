import "server-only";
import { appUrl, sendMail } from "@/lib/mail/send";
import { formatWhen } from "@/lib/reports/format";
import { roleLabels, type Role } from "./permissions";

/** E-mails an invitation link (`/invite/<token>`) to a user who has no password yet, saying when it expires (the stored expiry, UTC). */
export async function sendInvitationMail({
  user,
  invitation,
  actorName,
}: {
  user: { email: string; name: string; role: Role };
  invitation: { token: string; expiresAt: Date };
  actorName: string;
}): Promise<void> {
  await sendMail({
    to: user.email,
    subject: "Your Ordwise account",
    text: [
      `Hello ${user.name},`,
      "",
      `${actorName} has invited you to Ordwise as ${roleLabels[user.role]}.`,
      `Set your password here; the link works once, replaces any earlier link and expires on ${formatWhen(invitation.expiresAt)}:`,
      appUrl(`/invite/${invitation.token}`),
    ].join("\n"),
  });
}
