import "server-only";
import { appUrl, sendMail } from "@/lib/mail/send";
import { roleLabels, type Role } from "./permissions";

/** E-mails an invitation link (`/invite/<token>`) to a user who has no password yet. */
export async function sendInvitationMail({
  user,
  token,
  actorName,
}: {
  user: { email: string; name: string; role: Role };
  token: string;
  actorName: string;
}): Promise<void> {
  await sendMail({
    to: user.email,
    subject: "Your Ordwise account",
    text: [
      `Hello ${user.name},`,
      "",
      `${actorName} has invited you to Ordwise as ${roleLabels[user.role]}.`,
      `Set your password here (the link works once, expires in 72 hours and replaces any earlier link):`,
      appUrl(`/invite/${token}`),
    ].join("\n"),
  });
}
