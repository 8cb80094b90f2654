import { z } from "zod";
import { roles } from "@/lib/auth/permissions";

export const signInSchema = z.object({
  email: z.email("Enter a valid e-mail address").trim().toLowerCase(),
  password: z.string().min(1, "Enter your password"),
});

export const passwordSchema = z
  .string()
  .min(12, "Use at least 12 characters")
  .max(200, "Use at most 200 characters");

export const acceptInvitationSchema = z
  .object({ token: z.string().min(20), password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The passwords do not match" });

export const inviteUserSchema = z.object({
  email: z.email("Enter a valid e-mail address").trim().toLowerCase(),
  name: z.string().trim().min(2, "Name needs at least 2 characters").max(120),
  role: z.enum(roles, { error: "Choose a role" }),
});

export const updateUserSchema = z
  .object({ role: z.enum(roles).optional(), active: z.boolean().optional() })
  .refine((v) => v.role !== undefined || v.active !== undefined, "Nothing to change");

export type SignInInput = z.infer<typeof signInSchema>;
export type InviteUserInput = z.infer<typeof inviteUserSchema>;
export type UpdateUserInput = z.infer<typeof updateUserSchema>;
