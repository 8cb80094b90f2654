/** One message kept by the local mail catcher (scripts/services.ts) and listed as JSON for the dev mailbox and the tests. */
export interface CaughtMail {
  id: string;
  /** ISO 8601 time the catcher received it. */
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}
