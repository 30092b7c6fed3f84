"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { Field, FormAlert, buttonClass, inputClass, str, useApiForm } from "@/components/form";

interface StaffRow {
  id: string;
  name: string;
  email: string;
  role: "owner" | "office" | "tech";
  active: number;
}

const ROLE_HELP = { owner: "Owner: everything, staff and settings", office: "Office: customers, jobs, coating, e-mail", tech: "Tech: works the board and records" };

export function StaffManager({ initial, selfId }: { initial: StaffRow[]; selfId: string }) {
  const qc = useQueryClient();
  const { data } = useQuery({ queryKey: ["staff"], queryFn: () => api<{ staff: StaffRow[] }>("/api/staff").then((r) => r.staff), initialData: initial });
  const [rowFailure, setRowFailure] = useState<ApiFailure | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const refresh = () => qc.invalidateQueries({ queryKey: ["staff"] });

  async function patch(id: string, body: Record<string, unknown>, done: string) {
    setRowFailure(null);
    setNotice(null);
    try {
      await api(`/api/staff/${id}`, { method: "PATCH", body });
      setNotice(done);
      await refresh();
    } catch (err) {
      if (err instanceof ApiRequestError) setRowFailure(err.failure);
    }
  }

  const add = useApiForm(
    (v) => ({ path: "/api/staff", body: { name: str(v.name), email: str(v.email), role: str(v.role), password: str(v.password) } }),
    () => {
      setNotice("Staff member added. Give them their e-mail and the password you chose.");
      void refresh();
    },
  );

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_360px]">
      <div className="space-y-2">
        <FormAlert failure={rowFailure} />
        {notice && <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">✓ {notice}</p>}
        <ul className="divide-y divide-line rounded-lg border border-line bg-panel">
          {data.map((s) => (
            <li key={s.id} className="flex flex-wrap items-center gap-3 p-3">
              <div className="min-w-48 flex-1">
                <p className="font-semibold">
                  {s.name} {s.id === selfId && <span className="text-sm font-normal text-ink-soft">(you)</span>}
                </p>
                <p className="text-sm text-ink-soft">{s.email}</p>
                {!s.active && <p className="text-sm font-semibold text-stop-700">⦸ Deactivated</p>}
              </div>
              <label className="text-sm">
                <span className="sr-only">Role of {s.name}</span>
                <select
                  className={`${inputClass} w-32`}
                  value={s.role}
                  disabled={s.id === selfId}
                  onChange={(e) => {
                    const role = e.target.value;
                    // A slip here could hand someone the keys to the shop: ask first.
                    if (window.confirm(`Make ${s.name} ${role}? They are signed out and sign in again with the new role.`)) void patch(s.id, { role }, `${s.name} is now ${role}.`);
                    else e.target.value = s.role;
                  }}
                >
                  <option value="owner">Owner</option>
                  <option value="office">Office</option>
                  <option value="tech">Tech</option>
                </select>
              </label>
              {s.id !== selfId && (
                <button type="button" className={s.active ? buttonClass.secondary : buttonClass.secondary} onClick={() => patch(s.id, { active: !s.active }, s.active ? `${s.name} is deactivated and signed out.` : `${s.name} can sign in again.`)}>
                  {s.active ? "Deactivate" : "Reactivate"}
                </button>
              )}
              <button
                type="button"
                className={buttonClass.secondary}
                onClick={() => {
                  const pw = window.prompt(`New password for ${s.name} (at least 10 characters):`);
                  if (pw) void patch(s.id, { password: pw }, `Password reset for ${s.name}; their sessions are ended.`);
                }}
              >
                Reset password
              </button>
            </li>
          ))}
        </ul>
      </div>
      <form onSubmit={add.onSubmit} className="space-y-3 rounded-lg border border-line bg-panel p-4" noValidate>
        <h2 className="text-lg font-bold">Add a staff member</h2>
        <FormAlert failure={add.failure} />
        <Field label="Name" name="name" errors={add.fields.name}>{(p) => <input {...p} className={inputClass} />}</Field>
        <Field label="E-mail" name="email" errors={add.fields.email}>{(p) => <input {...p} type="email" className={inputClass} />}</Field>
        <Field label="Role" name="role" errors={add.fields.role} hint={ROLE_HELP.tech}>
          {(p) => (
            <select {...p} defaultValue="tech" className={inputClass}>
              <option value="tech">{ROLE_HELP.tech}</option>
              <option value="office">{ROLE_HELP.office}</option>
              <option value="owner">{ROLE_HELP.owner}</option>
            </select>
          )}
        </Field>
        <Field label="First password" name="password" errors={add.fields.password} hint="At least 10 characters; they can change it later.">
          {(p) => <input {...p} type="password" autoComplete="new-password" className={inputClass} />}
        </Field>
        <button type="submit" className={buttonClass.primary} disabled={add.pending}>{add.pending ? "Adding…" : "Add staff member"}</button>
      </form>
    </div>
  );
}
