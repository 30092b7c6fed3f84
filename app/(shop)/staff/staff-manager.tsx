"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useRef, useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "@/components/api";
import { Field, FormAlert, buttonClass, inputClass, str, useApiForm } from "@/components/form";

interface StaffRow {
  id: string;
  name: string;
  email: string;
  role: "owner" | "office" | "tech";
  active: number;
}

type Role = StaffRow["role"];
const ROLE_WORDS: Record<Role, string> = { owner: "Owner", office: "Office", tech: "Tech" };
// What each role may do, said the way the shop would; the hint under Role follows the choice.
const ROLE_HELP: Record<Role, string> = {
  tech: "A tech moves cards on the board and records parts, leak tests, coating runs received and the sign-off.",
  office: "The office also adds customers, trucks and jobs, sends coating runs and keeps the customers' e-mail updates.",
  owner: "An owner can do everything the office does, and also adds and removes staff, overrides what a job needs, and sets the leak-test procedure.",
};

/** One staff row's pending question: deactivate or reset, asked on the page before anything changes. */
type Ask = { id: string; what: "deactivate" | "reset" } | null;

export function StaffManager({ initial, selfId }: { initial: StaffRow[]; selfId: string }) {
  const qc = useQueryClient();
  const { data } = useQuery({ queryKey: ["staff"], queryFn: () => api<{ staff: StaffRow[] }>("/api/staff").then((r) => r.staff), initialData: initial });
  const [rowFailure, setRowFailure] = useState<ApiFailure | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const refresh = () => qc.invalidateQueries({ queryKey: ["staff"] });
  const [ask, setAsk] = useState<Ask>(null);
  const [temporary, setTemporary] = useState<{ id: string; name: string; password: string } | null>(null);
  const [copied, setCopied] = useState(false);
  const [newRole, setNewRole] = useState<Role>("tech");
  const addRef = useRef<HTMLFormElement>(null);
  const nameRef = useRef<HTMLInputElement>(null);

  async function resetPassword(row: StaffRow) {
    setRowFailure(null);
    setNotice(null);
    setCopied(false);
    try {
      const answer = await api<{ name: string; temporaryPassword: string }>(`/api/staff/${row.id}/password-reset`, { method: "POST", body: {} });
      setTemporary({ id: row.id, name: answer.name, password: answer.temporaryPassword });
    } catch (err) {
      if (err instanceof ApiRequestError) setRowFailure(err.failure);
    } finally {
      setAsk(null);
    }
  }

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

  const add = useApiForm<{ staff: StaffRow }>(
    (v) => ({ path: "/api/staff", body: { name: str(v.name), email: str(v.email), role: newRole, password: str(v.password) } }),
    ({ staff }) => {
      // The form empties after each person, so the next one never inherits the last one's role or password.
      addRef.current?.reset();
      setNewRole("tech");
      setNotice(`${staff.name} added as ${ROLE_WORDS[staff.role].toLowerCase()}. Give them their e-mail and the first password in person; they can change it on their Account page.`);
      nameRef.current?.focus();
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
                    if (window.confirm(`Make ${s.name} ${role}? They are signed out on every device and sign in again with the new role.`)) void patch(s.id, { role }, `${s.name} is now ${role}.`);
                    else e.target.value = s.role;
                  }}
                >
                  <option value="owner">Owner</option>
                  <option value="office">Office</option>
                  <option value="tech">Tech</option>
                </select>
              </label>
              {s.id !== selfId && (
                <button
                  type="button"
                  className={buttonClass.secondary}
                  onClick={() => (s.active ? setAsk({ id: s.id, what: "deactivate" }) : patch(s.id, { active: true }, `${s.name} can sign in again.`))}
                >
                  {s.active ? "Deactivate" : "Reactivate"}
                </button>
              )}
              {s.id !== selfId && s.active ? (
                <button type="button" className={buttonClass.secondary} onClick={() => setAsk({ id: s.id, what: "reset" })}>
                  Reset password
                </button>
              ) : null}
              {s.id === selfId && (
                <a href="/account" className={buttonClass.secondary}>
                  Change your password
                </a>
              )}
              {ask?.id === s.id && (
                <div role="group" aria-label={`Confirm for ${s.name}`} className="w-full rounded-md border-2 border-warn-700/50 bg-warn-100 p-3 text-sm">
                  <p className="font-semibold text-ink">
                    {ask.what === "deactivate"
                      ? `Deactivate ${s.name}? They are signed out on every device at once and cannot sign in until reactivated. Their records stay.`
                      : `Reset ${s.name}'s password? They are signed out on every device, and a temporary password is shown here once for you to give them. They choose their own at next sign-in.`}
                  </p>
                  <div className="mt-2 flex flex-wrap gap-2">
                    <button
                      type="button"
                      className={ask.what === "deactivate" ? buttonClass.danger : buttonClass.primary}
                      autoFocus
                      onClick={() => {
                        if (ask.what === "deactivate") {
                          setAsk(null);
                          void patch(s.id, { active: false }, `${s.name} is deactivated and signed out on every device.`);
                        } else void resetPassword(s);
                      }}
                    >
                      {ask.what === "deactivate" ? `Deactivate ${s.name}` : "Reset password"}
                    </button>
                    <button type="button" className={buttonClass.secondary} onClick={() => setAsk(null)}>
                      Keep as is
                    </button>
                  </div>
                </div>
              )}
              {temporary?.id === s.id && (
                <div role="status" className="w-full rounded-md border-2 border-bay-700/40 bg-bay-50 p-3 text-sm">
                  <p className="font-semibold text-ink">Temporary password for {temporary.name}, shown this once:</p>
                  <div className="mt-2 flex flex-wrap items-center gap-2">
                    <code data-testid="temporary-password" className="rounded bg-panel px-2 py-1 font-mono text-lg tracking-wider text-ink">
                      {temporary.password}
                    </code>
                    <button
                      type="button"
                      className={buttonClass.secondary}
                      onClick={async () => {
                        try {
                          await navigator.clipboard.writeText(temporary.password);
                          setCopied(true);
                        } catch {
                          setCopied(false);
                        }
                      }}
                    >
                      {copied ? "Copied" : "Copy"}
                    </button>
                    <button type="button" className={buttonClass.secondary} onClick={() => setTemporary(null)}>
                      Done, hide it
                    </button>
                  </div>
                  <p className="mt-2 text-ink-soft">Give it to {temporary.name} in person. They are asked to choose their own password when they sign in with it.</p>
                </div>
              )}
            </li>
          ))}
        </ul>
      </div>
      <form ref={addRef} onSubmit={add.onSubmit} className="space-y-3 rounded-lg border border-line bg-panel p-4" noValidate aria-labelledby="add-staff-title">
        <h2 id="add-staff-title" className="text-lg font-bold">Add a staff member</h2>
        <FormAlert failure={add.failure} />
        <Field label="Name" name="name" errors={add.fields.name}>{(p) => <input {...p} ref={nameRef} autoComplete="off" className={inputClass} />}</Field>
        <Field label="E-mail" name="email" errors={add.fields.email} hint="They sign in with it.">{(p) => <input {...p} type="email" autoComplete="off" className={inputClass} />}</Field>
        <Field label="Role" name="role" errors={add.fields.role} hint={ROLE_HELP[newRole]}>
          {(p) => (
            <select {...p} value={newRole} onChange={(e) => setNewRole(e.target.value as Role)} className={inputClass}>
              <option value="tech">Tech</option>
              <option value="office">Office</option>
              <option value="owner">Owner</option>
            </select>
          )}
        </Field>
        <Field label="First password" name="password" errors={add.fields.password} hint="At least 10 characters. Give it to them in person; they can change it on their Account page.">
          {(p) => <input {...p} type="password" autoComplete="new-password" className={inputClass} />}
        </Field>
        <button type="submit" className={buttonClass.primary} disabled={add.pending}>{add.pending ? "Adding…" : `Add ${ROLE_WORDS[newRole].toLowerCase()}`}</button>
      </form>
    </div>
  );
}
