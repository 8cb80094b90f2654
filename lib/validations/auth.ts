import { z } from "zod";
import { roles } from "@/lib/auth/permissions";
import { singleLineText } from "./text";

export const signInSchema = z.object({
  email: z.email("Enter a valid e-mail address").trim().toLowerCase(),
  // Refused before any hashing: a long password would otherwise cost the server time and memory.
  password: z.string().min(1, "Enter your password").max(200, "Passwords have at most 200 characters"),
});

export const passwordSchema = z
  .string()
  .min(12, "Use at least 12 characters")
  .max(200, "Use at most 200 characters");

export const acceptInvitationSchema = z
  .object({ token: singleLineText().min(20).max(100), password: passwordSchema, confirm: z.string().max(200) })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The passwords do not match" });

export const inviteUserSchema = z.object({
  email: z.email("Enter a valid e-mail address").trim().toLowerCase(),
  name: singleLineText().trim().min(2, "Name needs at least 2 characters").max(120),
  role: z.enum(roles, { error: "Choose a role" }),
});

export const updateUserSchema = z
  .object({ role: z.enum(roles).optional(), active: z.boolean().optional() })
  .refine((v) => v.role !== undefined || v.active !== undefined, "Nothing to change");

export type SignInInput = z.infer<typeof signInSchema>;
export type InviteUserInput = z.infer<typeof inviteUserSchema>;
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

/** A user id in a route (lucia ids are lower-case base32; demo and older ids may use other URL-safe characters). */
export const userParamsSchema = z.object({ id: z.string().regex(/^[A-Za-z0-9_-]{1,64}$/, "Not a user id") });
