import "server-only";
import { DrizzlePostgreSQLAdapter } from "@lucia-auth/adapter-drizzle";
import { Lucia, TimeSpan } from "lucia";
import { db } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { cookieSecure } from "./cookie-secure";
import type { Role } from "./permissions";

const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);

export const lucia = new Lucia(adapter, {
  sessionExpiresIn: new TimeSpan(12, "h"),
  sessionCookie: {
    name: "ordwise_session",
    attributes: { secure: cookieSecure(process.env.APP_URL), sameSite: "lax" },
  },
  getSessionAttributes: (attributes) => ({ createdAt: attributes.createdAt }),
  getUserAttributes: (attributes) => ({
    email: attributes.email,
    name: attributes.name,
    role: attributes.role,
    active: attributes.active,
  }),
});

declare module "lucia" {
  interface Register {
    Lucia: typeof lucia;
    DatabaseUserAttributes: { email: string; name: string; role: Role; active: boolean };
    DatabaseSessionAttributes: { createdAt: Date };
  }
}
