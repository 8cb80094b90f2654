"use client";

import { useState } from "react";
import { roleLabels, roles, type Role } from "@/lib/auth/permissions";
import { fieldErrorsOf } from "@/lib/errors";
import { FetchError, sendJson } from "@/lib/swr/fetcher";
import { useUsers } from "@/lib/swr/use-users";
import { inviteUserSchema } from "@/lib/validations/auth";

export function UsersAdmin({ myId }: { myId: string }) {
  const { data, error, mutate } = useUsers();
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);

  async function invite(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const fd = new FormData(form);
    const parsed = inviteUserSchema.safeParse({ email: fd.get("email"), name: fd.get("name"), role: fd.get("role") });
    if (!parsed.success) return setErrors(fieldErrorsOf(parsed.error));
    setErrors({});
    try {
      await sendJson("/api/users", "POST", parsed.data);
      setMessage(`Invitation sent to ${parsed.data.email}.`);
      form.reset();
      await mutate();
    } catch (err) {
      if (err instanceof FetchError && err.fieldErrors) setErrors(err.fieldErrors);
      setMessage(err instanceof Error ? err.message : "Could not send the invitation.");
    }
  }

  async function update(id: string, change: { role?: Role; active?: boolean }) {
    try {
      await sendJson(`/api/users/${id}`, "PATCH", change);
      setMessage(null);
      await mutate();
    } catch (err) {
      setMessage(err instanceof Error ? err.message : "Could not change the user.");
    }
  }

  async function resend(id: string, email: string) {
    try {
      await sendJson(`/api/users/${id}/invitation`, "POST");
      setMessage(`A new invitation was sent to ${email}; earlier links no longer work.`);
      await mutate();
    } catch (err) {
      setMessage(err instanceof Error ? err.message : "Could not resend the invitation.");
    }
  }

  return (
    <div className="space-y-6">
      <form onSubmit={invite} className="panel grid gap-3 sm:grid-cols-[1fr_1fr_10rem_auto] sm:items-end" noValidate data-testid="invite-form">
        <div>
          <label htmlFor="invite-email" className="field-label">E-mail</label>
          <input id="invite-email" name="email" type="email" className="field-input" />
          {errors.email?.map((m) => <p key={m} className="field-error">{m}</p>)}
        </div>
        <div>
          <label htmlFor="invite-name" className="field-label">Name</label>
          <input id="invite-name" name="name" className="field-input" />
          {errors.name?.map((m) => <p key={m} className="field-error">{m}</p>)}
        </div>
        <div>
          <label htmlFor="invite-role" className="field-label">Role</label>
          <select id="invite-role" name="role" className="field-input" defaultValue="technician">
            {roles.map((r) => <option key={r} value={r}>{roleLabels[r]}</option>)}
          </select>
        </div>
        <button type="submit" className="btn-primary">Send invitation</button>
      </form>
      {message && <p className="text-sm" role="status">{message}</p>}
      {error && <p className="text-sm text-fail">{error.message}</p>}
      <div className="panel p-0 sm:overflow-x-auto sm:p-5">
        {/* On a phone each user is a card (the table stacks): name, e-mail, role, status and the buttons, nothing off-screen. */}
        <table className="table-base table-stack" data-testid="user-table">
          <thead>
            <tr><th>Name</th><th>E-mail</th><th>Role</th><th>Status</th><th><span className="sr-only">Actions</span></th></tr>
          </thead>
          <tbody>
            {data?.users.map((u) => (
              <tr key={u.id} data-testid="user-row">
                <td className="font-medium">{u.name}</td>
                <td className="stack-wide break-all" data-label="E-mail">{u.email}</td>
                <td data-label="Role">
                  <select
                    aria-label={`Role of ${u.email}`}
                    className="rounded border border-line bg-paper-raised px-2 py-1 text-sm"
                    value={u.role}
                    disabled={u.id === myId}
                    onChange={(e) => update(u.id, { role: e.target.value as Role })}
                  >
                    {roles.map((r) => <option key={r} value={r}>{roleLabels[r]}</option>)}
                  </select>
                </td>
                <td data-label="Status">{!u.active ? "Deactivated" : u.invited ? "Invited" : "Active"}</td>
                <td className="sm:whitespace-nowrap sm:text-right">
                  <span className="flex flex-wrap gap-2 sm:justify-end">
                    {u.active && u.invited && (
                      <button type="button" className="btn-quiet py-1" onClick={() => resend(u.id, u.email)}>
                        Resend invitation
                      </button>
                    )}
                    {u.id !== myId && (
                      <button type="button" className="btn-quiet py-1" onClick={() => update(u.id, { active: !u.active })}>
                        {u.active ? "Deactivate" : "Reactivate"}
                      </button>
                    )}
                  </span>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
