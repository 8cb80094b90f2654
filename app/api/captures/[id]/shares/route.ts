import { encodeBase32LowerCaseNoPadding } from "@oslojs/encoding";
import { NextResponse } from "next/server";
import { createShareLink, getCaptureById, listShareLinks } from "@/db/queries/captures";
import { hashToken } from "@/db/queries/users";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { appUrl } from "@/lib/mail/send";
import { createShareSchema } from "@/lib/validations/capture";

// GET /api/captures/:id/shares — the capture's share links (tokens are not recoverable)
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    await getCaptureById({ id, reader: user });
    const links = await listShareLinks({ captureId: id });
    return NextResponse.json({ shares: links.map(({ tokenHash: _t, ...l }) => l) });
  },
  { permission: "captures:share" },
);

// POST /api/captures/:id/shares — create an expiring read-only link for someone outside the team
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    const { label, expiresInDays } = createShareSchema.parse(await readJson(req));
    await getCaptureById({ id, reader: user });
    const token = encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(20)));
    const expiresAt = new Date(Date.now() + expiresInDays * 86_400_000);
    const link = await createShareLink({ captureId: id, tokenHash: hashToken(token), label, expiresAt, actorId: user.id });
    return NextResponse.json({ share: { id: link.id, label, expiresAt }, url: appUrl(`/share/${token}`) }, { status: 201 });
  },
  { permission: "captures:share" },
);
