import "server-only";
import { redirect, forbidden, notFound } from "next/navigation";
import type { User } from "lucia";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { getCurrentSession } from "./session";
import { can, type Permission } from "./permissions";

/** For pages: the signed-in user holding `permission`; otherwise sign-in or the 403 page. */
export async function requirePage(permission: Permission | null): Promise<User> {
  const { user } = await getCurrentSession();
  if (!user) redirect("/sign-in");
  if (permission && !can(user.role, permission)) forbidden();
  return user;
}

/** `load`'s value, with "no such thing" (an AppError `not_found`) shown as the 404 page; other errors pass. */
export function orNotFound<T>(load: Promise<T>): Promise<T> {
  return load.catch((err: unknown) => {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  });
}

/** The route's id when it is a UUID, else the 404 page. */
export function uuidOr404(id: string): string {
  if (!z.uuid().safeParse(id).success) notFound();
  return id;
}
