import { NextResponse } from "next/server";
import { updateUser } from "@/db/queries/users";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { updateUserSchema } from "@/lib/validations/auth";

// PATCH /api/users/:id — change a role or (de)activate (admin)
export const PATCH = withAuth<{ id: string }>(
  async ({ req, user, params }) => {
    const input = updateUserSchema.parse(await readJson(req));
    return NextResponse.json({ user: await updateUser({ id: params.id, ...input, actorId: user.id }) });
  },
  { permission: "users:manage" },
);
