"use client";

import { type ReactNode, useId, useState } from "react";
import { type ApiFailure, ApiRequestError, api } from "./api";

import { buttonClass } from "./styles";

export { buttonClass, inputClass } from "./styles";

/** A labelled field with its error beside it, announced to screen readers. */
export function Field({ label, name, errors, hint, hintTone, children }: { label: string; name: string; errors?: string[]; hint?: string; /** "warn" for a caution the entry raises (not an error: it still saves). */ hintTone?: "warn"; children: (props: { id: string; "aria-invalid": boolean; "aria-describedby": string; name: string }) => ReactNode }) {
  const id = useId();
  const describedBy = `${id}-msg`;
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-semibold text-ink">
        {label}
      </label>
      {children({ id, name, "aria-invalid": Boolean(errors?.length), "aria-describedby": describedBy })}
      <p id={describedBy} aria-live="polite" className={errors?.length ? "text-sm font-medium text-stop-700" : hintTone === "warn" ? "text-sm font-medium text-warn-700" : "text-sm text-ink-soft"}>
        {errors?.length ? `⚠ ${errors.join(" ")}` : hint}
      </p>
    </div>
  );
}

export function FormAlert({ failure }: { failure: ApiFailure | null }) {
  if (!failure) return null;
  return (
    <div role="alert" className="rounded-md border border-stop-700/40 bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
      {failure.message}
    </div>
  );
}

/**
 * State for a form that sends JSON to the API: the failure (with field errors) and a pending
 * flag. Inputs stay uncontrolled with their typed values, so nothing is lost after an error.
 */
export function useApiForm<T>(send: (values: Record<string, FormDataEntryValue>) => { path: string; method?: string; body: unknown }, onDone: (result: T) => void) {
  const [failure, setFailure] = useState<ApiFailure | null>(null);
  const [pending, setPending] = useState(false);
  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setPending(true);
    setFailure(null);
    try {
      const values = Object.fromEntries(new FormData(event.currentTarget).entries());
      const req = send(values);
      const result = await api<T>(req.path, { method: req.method ?? "POST", body: req.body });
      onDone(result);
    } catch (err) {
      if (err instanceof ApiRequestError) setFailure(err.failure);
      else throw err;
    } finally {
      setPending(false);
    }
  }
  return { failure, pending, onSubmit, fields: failure?.fields ?? {} };
}

export function str(v: FormDataEntryValue | undefined) {
  return typeof v === "string" ? v : "";
}

/** Empty inputs become undefined (optional) and numbers are sent as numbers, so the server's schema speaks. */
export function num(v: FormDataEntryValue | undefined): number | undefined | string {
  const s = str(v).trim();
  if (s === "") return undefined;
  const n = Number(s);
  return Number.isFinite(n) ? n : s;
}

/** A form's closing row: the submit button (with its pending wording) and Cancel. */
export function FormActions({ pending, label, pendingLabel, onCancel, describedBy }: { pending: boolean; label: string; pendingLabel: string; onCancel: () => void; describedBy?: string }) {
  return (
    <div className="flex flex-wrap gap-2">
      <button type="submit" className={`${buttonClass.primary} flex-1 sm:flex-none`} disabled={pending} aria-describedby={describedBy}>
        {pending ? pendingLabel : label}
      </button>
      <button type="button" className={buttonClass.secondary} onClick={onCancel}>
        Cancel
      </button>
    </div>
  );
}
