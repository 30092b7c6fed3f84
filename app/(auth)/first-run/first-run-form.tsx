"use client";

import { useActionState } from "react";
import { Field, buttonClass, inputClass } from "@/components/form";
import { type FirstRunState, createOwnerAction } from "./actions";

export function FirstRunForm() {
  const [state, action, pending] = useActionState<FirstRunState, FormData>(createOwnerAction, {});
  const v = state.values ?? {};
  const f = state.fields ?? {};
  return (
    <form action={action} className="space-y-4" noValidate>
      {state.message && <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">{state.message}</p>}
      <Field label="Shop name" name="shopName" errors={f.shopName}>{(p) => <input {...p} defaultValue={v.shopName} className={inputClass} />}</Field>
      <Field label="Shop phone (shown to customers)" name="shopPhone" errors={f.shopPhone}>{(p) => <input {...p} type="tel" defaultValue={v.shopPhone} className={inputClass} />}</Field>
      <Field label="Your name" name="name" errors={f.name}>{(p) => <input {...p} autoComplete="name" defaultValue={v.name} className={inputClass} />}</Field>
      <Field label="Your e-mail" name="email" errors={f.email}>{(p) => <input {...p} type="email" autoComplete="username" defaultValue={v.email} className={inputClass} />}</Field>
      <Field label="Password" name="password" errors={f.password} hint="At least 10 characters.">{(p) => <input {...p} type="password" autoComplete="new-password" className={inputClass} />}</Field>
      <button type="submit" className={`${buttonClass.primary} w-full`} disabled={pending}>{pending ? "Creating…" : "Create the owner account"}</button>
    </form>
  );
}
