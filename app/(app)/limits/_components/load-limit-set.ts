import "server-only";
import { notFound } from "next/navigation";
import { orNotFound } from "@/lib/auth/page";
import { limitSetKeySchema, revisionNumberSchema } from "@/lib/validations/limit-set";

/** Validates the route's key (and revision number) and turns "no such set" into the 404 page. */
export async function loadOr404<T>(key: string, load: (key: string) => Promise<T>): Promise<T> {
  if (!limitSetKeySchema.safeParse(key).success) notFound();
  return orNotFound(load(key));
}

export function revisionNumberOr404(number: string): number {
  const parsed = revisionNumberSchema.safeParse(number);
  if (!parsed.success) notFound();
  return parsed.data;
}

/** Server data → the JSON shape the client receives from the API (dates as ISO strings). */
export function toWire<T>(value: unknown): T {
  return JSON.parse(JSON.stringify(value)) as T;
}
