"use client";

import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { Field, FormAlert, buttonClass, inputClass, str, useApiForm } from "@/components/form";
import { CUSTOMER_KIND_LABELS, CUSTOMER_LIMITS } from "@/server/customers/labels";
import type { ContactView, CustomerFacts } from "@/server/customers/schemas";
import { bannerFor, useFocusFirstProblem } from "./controls";

interface Saved {
  customer: CustomerFacts;
  contacts: ContactView[];
}

interface ContactRow {
  key: string;
  id?: number;
  initial?: ContactView;
}

const rowsFrom = (contacts: ContactView[]): ContactRow[] => contacts.map((c) => ({ key: `saved-${c.id}`, id: c.id, initial: c }));

/** New customer when `saved` is absent; otherwise edits the customer and replaces its contact list on save. */
export function CustomerForm({ saved: first }: { saved?: Saved }) {
  const router = useRouter();
  const [saved, setSaved] = useState(first);
  const [rows, setRows] = useState<ContactRow[]>(() => (first ? rowsFrom(first.contacts) : [{ key: "new-0" }]));
  const [version, setVersion] = useState(0);
  const [notice, setNotice] = useState<string | null>(null);
  const [kind, setKind] = useState<string>(first?.customer.kind ?? "company");
  const newKeys = useRef(1);
  // Field errors name contacts by their place in the list that was sent; remember which row was where.
  const sentKeys = useRef<string[]>([]);

  const form = useApiForm<Saved>(
    (v) => {
      setNotice(null);
      const filled = rows
        .map((r) => ({
          key: r.key,
          contact: {
            ...(r.id !== undefined ? { id: r.id } : {}),
            name: str(v[`contact-${r.key}-name`]),
            email: str(v[`contact-${r.key}-email`]),
            phone: str(v[`contact-${r.key}-phone`]),
            receivesEmail: v[`contact-${r.key}-receivesEmail`] === "on",
          },
        }))
        // A row left completely empty is an unused slot, not a contact without a name.
        .filter(({ contact: x }) => x.id !== undefined || `${x.name}${x.email}${x.phone}`.trim() !== "");
      sentKeys.current = filled.map((x) => x.key);
      const contacts = filled.map((x) => x.contact);
      const body = { kind: str(v.kind), name: str(v.name), phone: str(v.phone), email: str(v.email), notes: str(v.notes), contacts };
      return saved ? { path: `/api/customers/${saved.customer.id}`, method: "PATCH", body } : { path: "/api/customers", body };
    },
    (result) => {
      if (!saved) {
        router.push(`/customers/${result.customer.id}`);
        return;
      }
      setSaved(result);
      setRows(rowsFrom(result.contacts));
      setVersion((n) => n + 1);
      setNotice("Customer saved.");
      router.refresh();
    },
  );
  const f = form.fields;
  const formRef = useRef<HTMLFormElement>(null);
  useFocusFirstProblem(formRef, form.failure);
  const rowErrors = (key: string, field: string) => {
    const at = sentKeys.current.indexOf(key);
    return at === -1 ? undefined : f[`contacts.${at}.${field}`];
  };
  const c = saved?.customer;

  return (
    <form ref={formRef} key={version} onSubmit={form.onSubmit} noValidate className="space-y-5">
      <FormAlert failure={bannerFor(form.failure)} />
      {notice && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
          ✓ {notice}
        </p>
      )}

      <fieldset className="space-y-3 rounded-lg border border-line bg-panel p-4">
        <legend className="px-1 text-lg font-bold">Customer</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <Field
            label="Kind"
            name="kind"
            errors={f.kind}
            hint={kind === "owner_operator" ? "An owner-operator drives their own truck; they are usually the contact too." : "A fleet or business: add the people who hear about its jobs as contacts."}
          >
            {(p) => (
              <select {...p} defaultValue={c?.kind ?? "company"} onChange={(e) => setKind(e.target.value)} className={inputClass}>
                <option value="company">{CUSTOMER_KIND_LABELS.company} (fleet or business)</option>
                <option value="owner_operator">{CUSTOMER_KIND_LABELS.owner_operator}</option>
              </select>
            )}
          </Field>
          <Field label="Name" name="name" errors={f.name}>
            {(p) => <input {...p} defaultValue={c?.name} maxLength={CUSTOMER_LIMITS.name} autoComplete="organization" className={inputClass} />}
          </Field>
          <Field label="Phone" name="phone" errors={f.phone}>
            {(p) => <input {...p} type="tel" defaultValue={c?.phone} maxLength={CUSTOMER_LIMITS.phone} placeholder="(555) 010-0100" className={inputClass} />}
          </Field>
          <Field label="E-mail" name="email" errors={f.email}>
            {(p) => <input {...p} type="email" defaultValue={c?.email} maxLength={CUSTOMER_LIMITS.email} placeholder="office@fleet.example" className={inputClass} />}
          </Field>
        </div>
        <Field label="Notes (staff only)" name="notes" errors={f.notes} hint="Never shown to the customer.">
          {(p) => <textarea {...p} rows={3} defaultValue={c?.notes} maxLength={CUSTOMER_LIMITS.notes} className={inputClass} />}
        </Field>
      </fieldset>

      <fieldset className="space-y-3 rounded-lg border border-line bg-panel p-4">
        <legend className="px-1 text-lg font-bold">Contacts</legend>
        <p className="text-sm text-ink-soft">
          People at this customer. Those marked &ldquo;gets e-mail updates&rdquo; get the status e-mails. Changes here are kept when you save.
        </p>
        {f.contacts && <p className="text-sm font-medium text-stop-700">⚠ {f.contacts.join(" ")}</p>}
        {rows.length === 0 && <p className="rounded-md border border-dashed border-line p-3 text-ink-soft">No contacts.</p>}
        <ol className="space-y-3">
          {rows.map((r, i) => (
            <li key={r.key}>
              <fieldset className="rounded-md border border-line bg-paper p-3">
                <legend className="sr-only">Contact {i + 1}</legend>
                <div className="mb-2 flex items-center justify-between gap-2">
                  <p aria-hidden="true" className="font-semibold">Contact {i + 1}</p>
                  <button
                    type="button"
                    className={buttonClass.secondary}
                    aria-label={`Remove contact ${i + 1}`}
                    onClick={() => setRows((all) => all.filter((x) => x.key !== r.key))}
                  >
                    <span aria-hidden="true">✕</span> Remove
                  </button>
                </div>
                <div className="grid gap-3 md:grid-cols-3">
                  <Field label="Name" name={`contact-${r.key}-name`} errors={rowErrors(r.key, "name")}>
                    {(p) => <input {...p} defaultValue={r.initial?.name} maxLength={CUSTOMER_LIMITS.name} placeholder="Name (role)" className={inputClass} />}
                  </Field>
                  <Field label="E-mail" name={`contact-${r.key}-email`} errors={rowErrors(r.key, "email")}>
                    {(p) => <input {...p} type="email" defaultValue={r.initial?.email} maxLength={CUSTOMER_LIMITS.email} className={inputClass} />}
                  </Field>
                  <Field label="Phone" name={`contact-${r.key}-phone`} errors={rowErrors(r.key, "phone")}>
                    {(p) => <input {...p} type="tel" defaultValue={r.initial?.phone} maxLength={CUSTOMER_LIMITS.phone} className={inputClass} />}
                  </Field>
                </div>
                <label className="mt-2 inline-flex min-h-11 cursor-pointer items-center gap-3 font-medium">
                  <input
                    type="checkbox"
                    name={`contact-${r.key}-receivesEmail`}
                    defaultChecked={r.initial ? r.initial.receivesEmail : true}
                    className="h-6 w-6 accent-bay-700"
                  />
                  Gets e-mail updates
                </label>
                {rowErrors(r.key, "receivesEmail") && <p className="text-sm font-medium text-stop-700">⚠ {rowErrors(r.key, "receivesEmail")!.join(" ")}</p>}
              </fieldset>
            </li>
          ))}
        </ol>
        <button
          type="button"
          className={buttonClass.secondary}
          disabled={rows.length >= CUSTOMER_LIMITS.contacts}
          onClick={() => setRows((all) => [...all, { key: `new-${newKeys.current++}` }])}
        >
          <span aria-hidden="true">+</span> Add contact
        </button>
      </fieldset>

      <button type="submit" className={`${buttonClass.primary} w-full sm:w-auto`} disabled={form.pending}>
        {form.pending ? "Saving…" : saved ? "Save customer" : "Add customer"}
      </button>
    </form>
  );
}
