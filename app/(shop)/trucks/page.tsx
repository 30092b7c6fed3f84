import Link from "next/link";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { listTrucks } from "@/server/trucks/queries";
import { TRUCK_LIMITS } from "@/server/trucks/schemas";
import { ButtonLink, SearchBox } from "../customers/controls";
import { linkClass } from "../customers/facts";

export const metadata = { title: "Trucks" };

export default async function TrucksPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageStaff();
  const raw = (await searchParams).q;
  const q = (typeof raw === "string" ? raw : "").trim().slice(0, TRUCK_LIMITS.search);
  const trucks = await listTrucks(getDb(), q ? { q } : {});

  return (
    <section className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-2xl font-bold">Trucks</h1>
        {user.role !== "tech" && (
          <ButtonLink href="/trucks/new">
            <span aria-hidden="true">+</span> New truck
          </ButtonLink>
        )}
      </div>
      <SearchBox action="/trucks" label="Search by unit number, VIN, description or customer" q={q} maxLength={TRUCK_LIMITS.search} />
      <p role="status" className="text-sm text-ink-soft">
        {trucks.length} {trucks.length === 1 ? "truck" : "trucks"}
        {q ? ` match \u201c${q}\u201d` : ""}.
      </p>
      {trucks.length > 0 && (
        <div className="overflow-x-auto rounded-lg border border-line bg-panel">
          <table className="w-full border-collapse text-left">
            <thead className="border-b border-line bg-bay-50 text-bay-900">
              <tr>
                <th scope="col" className="px-3 py-3 font-semibold">Unit</th>
                <th scope="col" className="px-3 py-3 font-semibold">Customer</th>
                <th scope="col" className="hidden px-3 py-3 font-semibold sm:table-cell">Year</th>
                <th scope="col" className="hidden px-3 py-3 font-semibold md:table-cell">Description</th>
                <th scope="col" className="hidden px-3 py-3 font-semibold lg:table-cell">VIN</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-line">
              {trucks.map((t) => (
                <tr key={t.id} className="hover:bg-paper">
                  <td className="px-3 py-1">
                    <Link href={`/trucks/${t.id}`} className={`flex min-h-11 items-center ${linkClass}`}>
                      {t.unitNumber}
                    </Link>
                  </td>
                  <td className="px-3 py-1">
                    <Link href={`/customers/${t.customerId}`} className="flex min-h-11 items-center hover:underline">
                      {t.customerName}
                    </Link>
                  </td>
                  <td className="hidden px-3 py-1 sm:table-cell">{t.year}</td>
                  <td className="hidden px-3 py-1 md:table-cell">{t.description || <span className="text-ink-soft">—</span>}</td>
                  <td className="hidden px-3 py-1 tracking-wide lg:table-cell">{t.vin}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
