"use client";

// The form kit lives in a client module, so its class strings only reach server pages through
// client components like these.
import Link from "next/link";
import { type ReactNode, type RefObject, useEffect } from "react";
import type { ApiFailure } from "@/components/api";
import { buttonClass, inputClass } from "@/components/form";

export function ButtonLink({ href, kind = "primary", className = "", children }: { href: string; kind?: keyof typeof buttonClass; className?: string; children: ReactNode }) {
  return (
    <Link href={href} className={`${buttonClass[kind]} ${className}`}>
      {children}
    </Link>
  );
}

/** A plain GET form, so the search lives in the URL and a view can be shared. */
export function SearchBox({ action, label, q, maxLength, keep = {} }: { action: string; label: string; q: string; maxLength: number; keep?: Record<string, string | undefined> }) {
  const inputId = `${action.replace(/\W/g, "")}-search`;
  return (
    <form role="search" action={action} method="get" className="flex max-w-xl flex-wrap items-end gap-2">
      <div className="min-w-0 flex-1 basis-56">
        <label htmlFor={inputId} className="block text-sm font-semibold">
          {label}
        </label>
        <input id={inputId} name="q" type="search" defaultValue={q} maxLength={maxLength} className={inputClass} />
      </div>
      {Object.entries(keep).map(([name, value]) => (value ? <input key={name} type="hidden" name={name} value={value} /> : null))}
      <button type="submit" className={buttonClass.secondary}>
        Search
      </button>
      {q && (
        <Link href={action} className={buttonClass.secondary}>
          Clear
        </Link>
      )}
    </form>
  );
}

/**
 * The API's validation message names fields by their keys; beside-the-field messages already say
 * what is wrong, so the banner only says where to look. Other refusals keep the server's words.
 */
export function bannerFor(failure: ApiFailure | null): ApiFailure | null {
  if (!failure || failure.code !== "validation") return failure;
  const count = Object.keys(failure.fields).filter((k) => k !== "_").length;
  if (count === 0) return failure;
  return { ...failure, message: count === 1 ? "Check the field marked ⚠ below." : `Check the ${count} fields marked ⚠ below.` };
}

/** After a refused save, focus the first field to fix: on a phone it may be a screen away from the button. */
export function useFocusFirstProblem(form: RefObject<HTMLFormElement | null>, failure: ApiFailure | null) {
  useEffect(() => {
    if (!failure) return;
    form.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [form, failure]);
}
