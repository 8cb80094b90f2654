"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { fieldErrorsOf } from "@/lib/errors";
import { sendJson } from "@/lib/swr/fetcher";
import { acceptInvitationSchema } from "@/lib/validations/auth";

export function AcceptForm({ token }: { token: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [error, setError] = useState<string | null>(null);

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    const parsed = acceptInvitationSchema.safeParse({ token, password: data.get("password"), confirm: data.get("confirm") });
    if (!parsed.success) return setErrors(fieldErrorsOf(parsed.error));
    setErrors({});
    try {
      await sendJson("/api/invitations/accept", "POST", parsed.data);
      router.push("/");
      router.refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : "Could not set the password.");
    }
  }

  return (
    <form onSubmit={submit} className="panel space-y-4" noValidate data-testid="accept-form">
      <div>
        <label htmlFor="password" className="field-label">New password</label>
        <input id="password" name="password" type="password" autoComplete="new-password" className="field-input" />
        {errors.password?.map((m) => <p key={m} className="field-error">{m}</p>)}
      </div>
      <div>
        <label htmlFor="confirm" className="field-label">Repeat the password</label>
        <input id="confirm" name="confirm" type="password" autoComplete="new-password" className="field-input" />
        {errors.confirm?.map((m) => <p key={m} className="field-error">{m}</p>)}
      </div>
      {error && <p className="rounded bg-fail-light px-3 py-2 text-sm text-fail" role="alert">{error}</p>}
      <button type="submit" className="btn-primary w-full">Set password and sign in</button>
    </form>
  );
}
