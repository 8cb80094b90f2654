import "server-only";
import { AppError } from "@/lib/errors";
import type { CaughtMail } from "./caught-mail";

export type { CaughtMail };

/** Messages from the local mail catcher (only present where MAIL_CATCHER_URL is set: dev and test). */
export async function listCaughtMail(): Promise<CaughtMail[]> {
  const base = process.env.MAIL_CATCHER_URL;
  if (!base) throw new AppError("not_found", "No local mail catcher in this deployment.");
  const res = await fetch(new URL("/messages", base), { cache: "no-store" });
  if (!res.ok) throw new AppError("internal", "The local mail catcher did not answer.");
  return (await res.json()) as CaughtMail[];
}
