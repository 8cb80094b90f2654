"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FetchError, sendJson } from "@/lib/swr/fetcher";

interface CustomerRow {
  id: string;
  name: string;
  siteIds: string[];
  viewerIds: string[];
}

/** Create customers; per customer, its name, the sites it owns and the viewers who belong to it. */
export function CustomersAdmin({
  customers,
  sites,
  viewers,
}: {
  customers: CustomerRow[];
  sites: { id: string; name: string }[];
  viewers: { id: string; name: string; email: string }[];
}) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);

  async function create(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const name = String(new FormData(form).get("name") ?? "");
    try {
      await sendJson("/api/customers", "POST", { name });
      setMessage(`Customer "${name.trim()}" added.`);
      form.reset();
      router.refresh();
    } catch (err) {
      setMessage(err instanceof FetchError ? (err.fieldErrors?.name?.[0] ?? err.message) : "Could not add the customer.");
    }
  }

  async function save(e: React.FormEvent<HTMLFormElement>, id: string) {
    e.preventDefault();
    const fd = new FormData(e.currentTarget);
    try {
      await sendJson(`/api/customers/${id}`, "PUT", {
        name: String(fd.get("name") ?? ""),
        siteIds: fd.getAll("siteIds").map(String),
        viewerIds: fd.getAll("viewerIds").map(String),
      });
      setMessage("Saved.");
      router.refresh();
    } catch (err) {
      setMessage(err instanceof Error ? err.message : "Could not save the customer.");
    }
  }

  return (
    <div className="space-y-4">
      <form onSubmit={create} className="panel flex flex-wrap items-end gap-3" noValidate data-testid="customer-create">
        <div className="min-w-0 flex-1">
          <label htmlFor="customer-name" className="field-label">New customer</label>
          <input id="customer-name" name="name" className="field-input" />
        </div>
        <button type="submit" className="btn-primary">Add customer</button>
      </form>
      {message && <p className="text-sm" role="status">{message}</p>}
      {customers.length === 0 && <p className="panel text-sm text-ink-soft">No customers yet.</p>}
      {customers.map((c) => (
        <form key={c.id} onSubmit={(e) => save(e, c.id)} className="panel space-y-3" data-testid="customer-form">
          <div>
            <label htmlFor={`name-${c.id}`} className="field-label">Name</label>
            <input id={`name-${c.id}`} name="name" defaultValue={c.name} className="field-input" />
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            <fieldset>
              <legend className="field-label">Sites it owns</legend>
              {sites.map((s) => (
                <label key={s.id} className="flex items-center gap-2 text-sm">
                  <input type="checkbox" name="siteIds" value={s.id} defaultChecked={c.siteIds.includes(s.id)} /> {s.name}
                </label>
              ))}
            </fieldset>
            <fieldset>
              <legend className="field-label">Viewers who belong to it</legend>
              {viewers.length === 0 && <p className="text-sm text-ink-soft">No users with the viewer role.</p>}
              {viewers.map((v) => (
                <label key={v.id} className="flex items-center gap-2 text-sm">
                  <input type="checkbox" name="viewerIds" value={v.id} defaultChecked={c.viewerIds.includes(v.id)} /> {v.name} ({v.email})
                </label>
              ))}
            </fieldset>
          </div>
          <button type="submit" className="btn-quiet">Save</button>
        </form>
      ))}
    </div>
  );
}
