import Link from "next/link";
import type { User } from "lucia";
import { can, roleLabels, type Permission } from "@/lib/auth/permissions";
import { SafetyFooter } from "./safety-note";
import { SignOutButton } from "./sign-out-button";
import { NavLinks } from "./nav-links";

const nav: { href: string; label: string; permission: Permission }[] = [
  { href: "/captures", label: "Captures", permission: "captures:read" },
  { href: "/sites", label: "Sites", permission: "sites:read" },
  { href: "/limits", label: "Limit tables", permission: "limits:read" },
  { href: "/admin/users", label: "Users", permission: "users:manage" },
  { href: "/admin/customers", label: "Customers", permission: "customers:manage" },
  { href: "/dev/mailbox", label: "Mailbox", permission: "mailbox:read" },
];

export function AppShell({ user, children }: { user: User; children: React.ReactNode }) {
  const links = nav.filter((n) => can(user.role, n.permission) && (n.href !== "/dev/mailbox" || process.env.MAIL_CATCHER_URL));
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-line bg-ink text-paper">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
          <Link href="/" className="flex items-center gap-2 text-lg font-semibold tracking-tight">
            <span aria-hidden className="inline-block h-4 w-4 rounded-sm bg-copper" />
            Ordwise
          </Link>
          <NavLinks links={links.map(({ href, label }) => ({ href, label }))} />
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="hidden sm:inline" data-testid="current-user">
              {user.name} · <span className="text-copper-light">{roleLabels[user.role]}</span>
            </span>
            <span className="[&_button]:text-paper">
              <SignOutButton />
            </span>
          </div>
        </div>
      </header>
      <main className="mx-auto w-full max-w-6xl flex-1 px-4 py-6">{children}</main>
      <SafetyFooter />
    </div>
  );
}
