"use client";

import { useRouter } from "next/navigation";
import { Field, FormAlert, buttonClass, inputClass, str, useApiForm } from "@/components/form";

export function SignInForm() {
  const router = useRouter();
  const form = useApiForm<{ user: { mustChangePassword?: boolean; role?: string } }>(
    (v) => ({ path: "/api/session", body: { email: str(v.email), password: str(v.password) } }),
    (answer) => {
      // A temporary password from the owner's reset goes straight to choosing a new one.
      // The office and owner start at the overview, a tech at the board.
      router.replace(answer.user.mustChangePassword ? "/account" : answer.user.role === "tech" ? "/board" : "/");
      router.refresh();
    },
  );
  return (
    <form onSubmit={form.onSubmit} className="space-y-4" noValidate>
      <FormAlert failure={form.failure} />
      <Field label="E-mail" name="email" errors={form.fields.email}>
        {(p) => <input {...p} type="email" autoComplete="username" required className={inputClass} />}
      </Field>
      <Field label="Password" name="password" errors={form.fields.password}>
        {(p) => <input {...p} type="password" autoComplete="current-password" required className={inputClass} />}
      </Field>
      <button type="submit" className={`${buttonClass.primary} w-full`} disabled={form.pending}>
        {form.pending ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
