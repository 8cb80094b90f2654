"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

export function SignOutButton() {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  return (
    <button
      type="button"
      className="text-sm text-ink-soft underline-offset-2 hover:underline"
      disabled={busy}
      data-testid="sign-out"
      onClick={async () => {
        setBusy(true);
        await fetch("/api/auth/sign-out", { method: "POST" });
        router.push("/sign-in");
        router.refresh();
      }}
    >
      Sign out
    </button>
  );
}
