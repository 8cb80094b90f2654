import { NextResponse } from "next/server";
import { createSite, listSites, toSiteView } from "@/db/queries/sites";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { siteInputSchema } from "@/lib/validations/site";

// GET /api/sites — the sites the caller may see (viewers: their customers' sites)
export const GET = withAuth(async ({ user }) => NextResponse.json({ sites: (await listSites({ reader: user })).map(toSiteView) }), { permission: "sites:read" });

// POST /api/sites — create a site
export const POST = withAuth(
  async ({ req, user }) => {
    const input = siteInputSchema.parse(await readJson(req));
    return NextResponse.json({ site: toSiteView(await createSite({ input, actorId: user.id })) }, { status: 201 });
  },
  { permission: "sites:create" },
);
