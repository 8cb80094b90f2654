import { NextResponse } from "next/server";
import { withAuth } from "@/lib/api/with-auth";
import { listCaughtMail } from "@/lib/mail/catcher";

// GET /api/dev/mailbox — messages held by the local mail catcher (admin, development only)
export const GET = withAuth(async () => NextResponse.json({ messages: await listCaughtMail() }), { permission: "mailbox:read" });
