import { AppShell } from "@/app/_components/app-shell";
import { requirePage } from "@/lib/auth/page";

export default async function SignedInLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePage(null);
  return <AppShell user={user}>{children}</AppShell>;
}
