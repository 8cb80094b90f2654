import { NextResponse } from "next/server";
import { updateCustomer } from "@/db/queries/customers";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { customerParamsSchema, updateCustomerSchema } from "@/lib/validations/customer";

// PUT /api/customers/:id — name, owned sites and member viewers (admin)
export const PUT = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = customerParamsSchema.parse(params);
    const input = updateCustomerSchema.parse(await readJson(req));
    return NextResponse.json({ customer: await updateCustomer({ id, input, actorId: user.id }) });
  },
  { permission: "customers:manage" },
);
