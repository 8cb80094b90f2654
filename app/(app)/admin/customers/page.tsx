import { listCustomers } from "@/db/queries/customers";
import { listSites } from "@/db/queries/sites";
import { listUsers } from "@/db/queries/users";
import { requirePage } from "@/lib/auth/page";
import { CustomersAdmin } from "./customers-admin";

export const metadata = { title: "Customers" };

export default async function CustomersPage() {
  const me = await requirePage("customers:manage");
  const [customers, sites, users] = await Promise.all([listCustomers(), listSites({ reader: me }), listUsers()]);
  return (
    <div className="max-w-4xl space-y-4">
      <h1>Customers</h1>
      <p className="text-sm text-ink-soft">
        A customer owns sites. Viewers who belong to a customer read only the approved sheets of that customer&apos;s sites; share links are unaffected.
      </p>
      <CustomersAdmin
        customers={customers}
        sites={sites.map((s) => ({ id: s.id, name: s.name }))}
        viewers={users.filter((u) => u.role === "viewer").map((u) => ({ id: u.id, name: u.name, email: u.email }))}
      />
    </div>
  );
}
