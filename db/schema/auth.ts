import { boolean, index, integer, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { roleEnum } from "./enums";
import { createdAtColumn, idColumn } from "./columns";

export const users = pgTable("users", {
  id: text("id").primaryKey(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  role: roleEnum("role").notNull(),
  // Null until an invited user sets a password.
  passwordHash: text("password_hash"),
  active: boolean("active").notNull().default(true),
  createdAt: createdAtColumn(),
});

// Shape required by @lucia-auth/adapter-drizzle.
export const sessions = pgTable(
  "sessions",
  {
    id: text("id").primaryKey(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    expiresAt: timestamp("expires_at", { withTimezone: true, mode: "date" }).notNull(),
    // When the session began: a session ends 7 days after this however active it is (lib/auth/session.ts).
    createdAt: timestamp("created_at", { withTimezone: true, mode: "date" }).notNull().defaultNow(),
  },
  // A user's sessions are ended together (deactivation, password change).
  (t) => [index("sessions_user_idx").on(t.userId)],
);

export const invitations = pgTable("invitations", {
  id: idColumn(),
  // SHA-256 of the token sent by e-mail; the token itself is never stored.
  tokenHash: text("token_hash").notNull().unique(),
  userId: text("user_id")
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  invitedBy: text("invited_by").references(() => users.id),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  acceptedAt: timestamp("accepted_at", { withTimezone: true }),
  createdAt: createdAtColumn(),
});

// Sign-in throttling: one row per key ("account:<e-mail>" or "client:<address>"), claimed atomically by an
// upsert before a password is checked (db/queries/users.ts).
export const signInThrottle = pgTable("sign_in_throttle", {
  key: text("key").primaryKey(),
  // Attempts claimed since the window began (a successful sign-in releases its claim).
  attempts: integer("attempts").notNull().default(0),
  windowStart: timestamp("window_start", { withTimezone: true }).notNull().defaultNow(),
  // No attempt for this key is checked before this time (exponential back-off).
  nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
  // A random value written by the attempt that last claimed the row, so the claimer can tell it won.
  claim: text("claim"),
});

export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
export type Role = User["role"];
