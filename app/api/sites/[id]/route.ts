import { NextResponse } from "next/server";
import { z } from "zod";
import { getSiteById, toSiteView, updateSite } from "@/db/queries/sites";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { siteInputSchema } from "@/lib/validations/site";

const paramsSchema = z.object({ id: z.uuid("Not a site id") });

// GET /api/sites/:id — one site
export const GET = withAuth<{ id: string }>(
  async ({ params, user }) => NextResponse.json({ site: toSiteView(await getSiteById({ ...paramsSchema.parse(params), reader: user })) }),
  { permission: "sites:read" },
);

// PUT /api/sites/:id — replace a site's details
export const PUT = withAuth<{ id: string }>(
  async ({ req, user, params }) => {
    const { id } = paramsSchema.parse(params);
    const input = siteInputSchema.parse(await readJson(req));
    return NextResponse.json({ site: toSiteView(await updateSite({ id, input, actorId: user.id })) });
  },
  { permission: "sites:write" },
);
