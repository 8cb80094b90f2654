// Customers own sites; viewers belong to customers and see only those sites (admin screen and API).
import { beforeAll, describe, expect, it } from "vitest";
import { signedIn, type Client } from "../support/http";

let admin: Client;
let viewer: Client;
let viewerId = "";
let engineerId = "";

beforeAll(async () => {
  admin = await signedIn("admin");
  viewer = await signedIn("viewer");
  const { users } = (await (await admin.request("GET", "/api/users")).json()) as { users: { id: string; email: string }[] };
  viewerId = users.find((u) => u.email === "viewer@ordwise.test")!.id;
  engineerId = users.find((u) => u.email === "engineer@ordwise.test")!.id;
});

async function newSite(name: string): Promise<string> {
  const res = await admin.request("POST", "/api/sites", { name, nominalVoltageV: 400, frequencyHz: 50 });
  expect(res.status).toBe(201);
  return ((await res.json()) as { site: { id: string } }).site.id;
}

describe("customers", () => {
  it("the demo scenario has customers, and the demo viewer belongs to exactly one of them", async () => {
    const { customers } = (await (await admin.request("GET", "/api/customers")).json()) as { customers: { name: string; siteIds: string[]; viewerIds: string[] }[] };
    expect(customers.length).toBeGreaterThanOrEqual(2);
    expect(customers.filter((c) => c.viewerIds.includes(viewerId)).length).toBe(1);
  });

  it("assigning a site and a viewer to a customer opens that site to the viewer; removing them closes it again", async () => {
    const stamp = Date.now();
    const siteId = await newSite(`Customer test feeder ${stamp}`);
    expect((await viewer.request("GET", `/api/sites/${siteId}`)).status).toBe(404);

    const created = await admin.request("POST", "/api/customers", { name: `Customer test co ${stamp}` });
    expect(created.status).toBe(201);
    const { customer } = (await created.json()) as { customer: { id: string; name: string } };

    const put = (body: unknown) => admin.request("PUT", `/api/customers/${customer.id}`, body);
    expect((await put({ name: customer.name, siteIds: [siteId], viewerIds: [viewerId] })).status).toBe(200);
    expect((await viewer.request("GET", `/api/sites/${siteId}`)).status).toBe(200);
    const { sites } = (await (await viewer.request("GET", "/api/sites")).json()) as { sites: { id: string }[] };
    expect(sites.map((s) => s.id)).toContain(siteId);
    // Still a member of the demo customer too: one viewer, several customers.
    expect(sites.length).toBeGreaterThanOrEqual(2);

    expect((await put({ name: customer.name, siteIds: [siteId], viewerIds: [] })).status).toBe(200);
    expect((await viewer.request("GET", `/api/sites/${siteId}`)).status).toBe(404);
  });

  it("refuses staff as members, unknown sites and duplicate names with a message naming the field", async () => {
    const stamp = Date.now();
    const { customer } = (await (await admin.request("POST", "/api/customers", { name: `Customer refusals ${stamp}` })).json()) as { customer: { id: string; name: string } };
    const staff = await admin.request("PUT", `/api/customers/${customer.id}`, { name: customer.name, siteIds: [], viewerIds: [engineerId] });
    expect(staff.status).toBe(422);
    expect(JSON.stringify(await staff.json())).toContain("viewer role");
    const unknown = await admin.request("PUT", `/api/customers/${customer.id}`, { name: customer.name, siteIds: ["00000000-0000-4000-8000-000000000000"], viewerIds: [] });
    expect(unknown.status).toBe(422);
    expect(JSON.stringify(await unknown.json())).toContain("siteIds");
    const dup = await admin.request("POST", "/api/customers", { name: customer.name });
    expect(dup.status).toBe(422);
    expect(JSON.stringify(await dup.json())).toContain("exists");
    expect((await admin.request("PUT", "/api/customers/00000000-0000-4000-8000-000000000000", { name: "Nobody Ltd", siteIds: [], viewerIds: [] })).status).toBe(404);
  });

  it("the admin screen lists customers with their sites and viewers", async () => {
    const res = await admin.request("GET", "/admin/customers");
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain("Quillbrook Cold Store Ltd");
    expect(html).toContain("Ruth Castellane (Quillbrook Cold Store Ltd)");
  });

  it("the demo viewer's display name names the customer she belongs to, not the utility", async () => {
    const { users } = (await (await admin.request("GET", "/api/users")).json()) as { users: { email: string; name: string }[] };
    const viewer = users.find((u) => u.email === "viewer@ordwise.test");
    expect(viewer?.name).toBe("Ruth Castellane (Quillbrook Cold Store Ltd)");
  });
});
