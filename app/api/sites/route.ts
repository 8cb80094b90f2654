import { NextResponse } from "next/server";
import { createSite, listSites } from "@/db/queries/sites";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { siteInputSchema } from "@/lib/validations/site";

// GET /api/sites — all sites
export const GET = withAuth(async () => NextResponse.json({ sites: await listSites() }), { permission: "sites:read" });

// POST /api/sites — create a site
export const POST = withAuth(
  async ({ req, user }) => {
    const input = siteInputSchema.parse(await readJson(req));
    return NextResponse.json({ site: await createSite({ input, actorId: user.id }) }, { status: 201 });
  },
  { permission: "sites:write" },
);
