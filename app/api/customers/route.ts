import { NextResponse } from "next/server";
import { createCustomer, listCustomers } from "@/db/queries/customers";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { createCustomerSchema } from "@/lib/validations/customer";

// GET /api/customers — every customer with its sites and viewers (admin)
export const GET = withAuth(async () => NextResponse.json({ customers: await listCustomers() }), { permission: "customers:manage" });

// POST /api/customers — create a customer (admin)
export const POST = withAuth(
  async ({ req, user }) => {
    const { name } = createCustomerSchema.parse(await readJson(req));
    return NextResponse.json({ customer: await createCustomer({ name, actorId: user.id }) }, { status: 201 });
  },
  { permission: "customers:manage" },
);
