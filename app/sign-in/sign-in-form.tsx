"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { SubmitButton } from "@/app/_components/submit-button";
import { sendJson } from "@/lib/swr/fetcher";

export function SignInForm() {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    setBusy(true);
    setError(null);
    try {
      await sendJson("/api/auth/sign-in", "POST", { email: data.get("email"), password: data.get("password") });
      router.push("/");
      router.refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : "Sign-in failed.");
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="panel space-y-4" data-testid="sign-in-form">
      <h1>Sign in</h1>
      <div>
        <label htmlFor="email" className="field-label">E-mail</label>
        <input id="email" name="email" type="email" autoComplete="username" required className="field-input" />
      </div>
      <div>
        <label htmlFor="password" className="field-label">Password</label>
        <input id="password" name="password" type="password" autoComplete="current-password" required className="field-input" />
      </div>
      {error && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{error}</p>}
      <SubmitButton busy={busy} busyLabel="Signing in…" className="btn-primary w-full">
        Sign in
      </SubmitButton>
    </form>
  );
}
