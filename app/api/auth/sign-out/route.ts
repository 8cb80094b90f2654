import { NextResponse } from "next/server";
import { withAuth } from "@/lib/api/with-auth";
import { endSession } from "@/lib/auth/session";

// POST /api/auth/sign-out — end the current session
export const POST = withAuth(
  async () => {
    await endSession();
    return NextResponse.json({ ok: true });
  },
  { permission: null },
);
