import { NextResponse } from "next/server";
import { updateUser } from "@/db/queries/users";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { updateUserSchema, userParamsSchema } from "@/lib/validations/auth";

// PATCH /api/users/:id — change a role or (de)activate (admin); deactivating ends sessions and open invitations
export const PATCH = withAuth<{ id: string }>(
  async ({ req, user, params }) => {
    const { id } = userParamsSchema.parse(params);
    const input = updateUserSchema.parse(await readJson(req, { maxBytes: 4 * 1024 }));
    return NextResponse.json({ user: await updateUser({ id, ...input, actorId: user.id }) });
  },
  { permission: "users:manage" },
);
