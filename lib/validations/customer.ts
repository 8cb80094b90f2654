import { z } from "zod";

// Shared by the customers admin page and the route handlers.
export const customerNameSchema = z.string().trim().min(2, "Name needs at least 2 characters").max(120, "Name is too long (max 120)");

export const createCustomerSchema = z.object({ name: customerNameSchema });

/** Replaces a customer's name, the sites it owns and the viewers who belong to it. */
export const updateCustomerSchema = z.object({
  name: customerNameSchema,
  siteIds: z.array(z.uuid("Not a site id")).max(500, "Too many sites"),
  viewerIds: z.array(z.string().min(1).max(64)).max(500, "Too many viewers"),
});

export const customerParamsSchema = z.object({ id: z.uuid("Not a customer id") });

export type UpdateCustomerInput = z.infer<typeof updateCustomerSchema>;
