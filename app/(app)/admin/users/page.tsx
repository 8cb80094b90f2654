import { requirePage } from "@/lib/auth/page";
import { UsersAdmin } from "./users-admin";

export const metadata = { title: "Users" };

export default async function UsersPage() {
  const me = await requirePage("users:manage");
  return (
    <div className="space-y-4">
      <h1>Users</h1>
      <UsersAdmin myId={me.id} />
    </div>
  );
}
