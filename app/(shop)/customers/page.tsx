import Link from "next/link";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { listCustomers } from "@/server/customers/queries";
import { CUSTOMER_KIND_LABELS, CUSTOMER_LIMITS, type CustomerSort, customerListQuerySchema } from "@/server/customers/schemas";
import { ButtonLink, SearchBox } from "./controls";
import { linkClass } from "./facts";

export const metadata = { title: "Customers" };

type Search = Promise<Record<string, string | string[] | undefined>>;

function one(v: string | string[] | undefined) {
  return Array.isArray(v) ? v[0] : v;
}

export default async function CustomersPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageStaff();
  const raw = await searchParams;
  // A hand-edited URL with a bad sort or an overlong search falls back to the plain list.
  const parsed = customerListQuerySchema.safeParse({ q: one(raw.q) || undefined, sort: one(raw.sort) || undefined, dir: one(raw.dir) || undefined });
  const query = parsed.success ? parsed.data : {};
  const sort: CustomerSort = query.sort ?? "name";
  const dir = query.dir ?? "asc";
  const customers = await listCustomers(getDb(), { ...query, sort, dir });
  const canEdit = user.role !== "tech";

  const sortHref = (column: CustomerSort) => {
    const nextDir = column === sort ? (dir === "asc" ? "desc" : "asc") : column === "trucks" ? "desc" : "asc";
    const params = new URLSearchParams({ ...(query.q ? { q: query.q } : {}), sort: column, dir: nextDir });
    return `/customers?${params}`;
  };
  const header = (column: CustomerSort, label: string, className = "") => {
    const active = column === sort;
    return (
      <th scope="col" aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : "none"} className={`px-3 py-1 ${className.includes("text-right") ? "" : "text-left"} ${className}`}>
        <Link href={sortHref(column)} className="inline-flex min-h-11 items-center gap-1 font-semibold text-bay-900 hover:underline">
          {label}
          <span aria-hidden="true" className="text-xs">{active ? (dir === "asc" ? "▲" : "▼") : "↕"}</span>
          <span className="sr-only">{active ? `, sorted ${dir === "asc" ? "ascending" : "descending"}` : ", sort"}</span>
        </Link>
      </th>
    );
  };

  return (
    <section className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold">Customers</h1>
        {canEdit && (
          <ButtonLink href="/customers/new">
            <span aria-hidden="true">+</span> New customer
          </ButtonLink>
        )}
      </div>

      <SearchBox action="/customers" label="Search by customer or contact name" q={query.q ?? ""} maxLength={CUSTOMER_LIMITS.search} keep={{ sort: query.sort, dir: query.dir }} />
      {!parsed.success && <p role="status" className="text-sm font-medium text-warn-700">⚠ The search or sort in the address was not understood; showing every customer by name.</p>}

      <p role="status" className="text-sm text-ink-soft">
        {query.q
          ? `${customers.length} ${customers.length === 1 ? "customer matches" : "customers match"} \u201c${query.q}\u201d.`
          : `${customers.length} ${customers.length === 1 ? "customer" : "customers"}.`}
      </p>

      {customers.length === 0 ? (
        <div className="rounded-lg border-2 border-dashed border-line bg-panel p-5">
          <p className="font-semibold">{query.q ? "No customer or contact has that name." : "No customers yet."}</p>
          {canEdit && !query.q && <p className="mt-1 text-ink-soft">Add the first one with New customer; their trucks go on the customer&apos;s page.</p>}
        </div>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-line bg-panel">
          <table className="w-full border-collapse text-left">
            <thead className="border-b border-line bg-bay-50">
              <tr>
                {header("name", "Name")}
                {header("kind", "Kind", "hidden sm:table-cell")}
                <th scope="col" className="hidden px-3 py-1 font-semibold text-bay-900 md:table-cell">Phone</th>
                <th scope="col" className="hidden px-3 py-1 font-semibold text-bay-900 lg:table-cell">E-mail</th>
                {header("trucks", "Trucks", "text-right")}
                <th scope="col" className="hidden px-3 py-1 text-right font-semibold text-bay-900 md:table-cell">Open jobs</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-line">
              {customers.map((c) => (
                <tr key={c.id} className="hover:bg-paper">
                  <td className="px-3 py-1">
                    <Link href={`/customers/${c.id}`} className={`flex min-h-11 flex-col justify-center ${linkClass}`}>
                      {c.name}
                    </Link>
                    <span className="block pb-1 text-sm text-ink-soft sm:hidden">{CUSTOMER_KIND_LABELS[c.kind]}</span>
                  </td>
                  <td className="hidden px-3 py-1 sm:table-cell">{CUSTOMER_KIND_LABELS[c.kind]}</td>
                  <td className="hidden px-3 py-1 whitespace-nowrap md:table-cell">{c.phone || <span className="text-ink-soft">—</span>}</td>
                  <td className="hidden px-3 py-1 lg:table-cell">{c.email || <span className="text-ink-soft">—</span>}</td>
                  <td className="px-3 py-1 text-right">{c.truckCount}</td>
                  <td className="hidden px-3 py-1 text-right md:table-cell">{c.openJobCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
