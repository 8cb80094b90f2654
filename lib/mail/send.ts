import "server-only";
import nodemailer from "nodemailer";

// The only module that speaks SMTP. Locally it reaches the mail catcher started by `npm start`.
const transport = nodemailer.createTransport({
  host: process.env.SMTP_HOST ?? "127.0.0.1",
  port: Number(process.env.SMTP_PORT ?? 2525),
  secure: false,
  // The local catcher offers no TLS; a hosted relay would set SMTP_TLS=1.
  ignoreTLS: process.env.SMTP_TLS !== "1",
});

/** Sends one message; `html` (optional) is an alternative part whose links are clickable in every client. */
export async function sendMail(msg: { to: string; subject: string; text: string; html?: string }): Promise<void> {
  await transport.sendMail({ from: process.env.MAIL_FROM ?? "Ordwise <no-reply@ordwise.test>", ...msg });
}

export function appUrl(pathname: string): string {
  return new URL(pathname, process.env.APP_URL ?? "http://127.0.0.1:3000").toString();
}

/** Escapes text for an HTML mail part. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}
