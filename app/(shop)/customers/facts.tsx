import Link from "next/link";
import type { ReactNode } from "react";

export const linkClass = "font-semibold text-bay-800 underline decoration-bay-600/40 underline-offset-2 hover:decoration-bay-600";

/** Label and value pairs for people who may read a record but not change it. */
export function Facts({ items }: { items: [label: string, value: ReactNode][] }) {
  return (
    <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[max-content_1fr]">
      {items.map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-sm font-semibold text-ink-soft">{label}</dt>
          <dd className="mb-2 break-words sm:mb-0">{value === "" || value === null || value === undefined ? <span className="text-ink-soft">Not given</span> : value}</dd>
        </div>
      ))}
    </dl>
  );
}

export function BackLink({ href, children }: { href: string; children: ReactNode }) {
  return (
    <Link href={href} className="inline-flex min-h-11 items-center gap-1 font-semibold text-bay-800 hover:underline">
      <span aria-hidden="true">←</span> {children}
    </Link>
  );
}

/** A route param that is not a positive whole number names no record. */
export function idFromParam(raw: string): number | null {
  return /^[1-9][0-9]{0,9}$/.test(raw) ? Number(raw) : null;
}
