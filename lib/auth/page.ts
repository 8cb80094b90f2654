import "server-only";
import { redirect, forbidden } from "next/navigation";
import type { User } from "lucia";
import { getCurrentSession } from "./session";
import { can, type Permission } from "./permissions";

/** For pages: the signed-in user holding `permission`; otherwise sign-in or the 403 page. */
export async function requirePage(permission: Permission | null): Promise<User> {
  const { user } = await getCurrentSession();
  if (!user) redirect("/sign-in");
  if (permission && !can(user.role, permission)) forbidden();
  return user;
}
