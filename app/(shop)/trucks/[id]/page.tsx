import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { listCustomerChoices } from "@/server/customers/queries";
import { findTruck } from "@/server/trucks/queries";
import { BackLink, Facts, idFromParam, linkClass } from "../../customers/facts";
import { TruckForm } from "../truck-form";

export const metadata = { title: "Truck" };

export default async function TruckPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageStaff();
  const id = idFromParam((await params).id);
  const truck = id === null ? undefined : await findTruck(getDb(), id);
  if (!truck) notFound();
  const canEdit = user.role !== "tech";

  return (
    <section className="space-y-3">
      <BackLink href={`/customers/${truck.customerId}`}>{truck.customerName}</BackLink>
      <div>
        <h1 className="text-2xl font-bold break-words">Unit {truck.unitNumber}</h1>
        <p className="text-ink-soft">
          {[truck.year, truck.make, truck.model].filter(Boolean).join(" ")}
          {truck.description ? ` ${truck.description}` : ""} · <Link href={`/customers/${truck.customerId}`} className={linkClass}>{truck.customerName}</Link>
        </p>
      </div>

      <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,1fr)_420px]">
        {canEdit ? (
          <TruckForm saved={truck} customers={await listCustomerChoices(getDb())} />
        ) : (
          <section aria-labelledby="truck-heading" className="space-y-3 rounded-lg border border-line bg-panel p-4">
            <h2 id="truck-heading" className="text-lg font-bold">Truck</h2>
            <Facts
              items={[
                ["Owner", truck.customerName],
                ["Unit number", truck.unitNumber],
                ["VIN", <span key="vin" className="tracking-wider">{truck.vin}</span>],
                ["Model year", String(truck.year)],
                ["Make", truck.make],
                ["Model", truck.model],
                ["Description", truck.description],
                ["Transmission", truck.transmission],
                ["PTO opening", truck.ptoOpening],
                ["Engine speed at work", truck.workEngineRpm === null ? "" : `${truck.workEngineRpm} rpm`],
              ]}
            />
            <p className="text-sm text-ink-soft">Only the office and the owner change truck details.</p>
          </section>
        )}

        <section aria-labelledby="jobs-heading" className="space-y-2 rounded-lg border-2 border-dashed border-line bg-panel p-4">
          <h2 id="jobs-heading" className="text-lg font-bold">Jobs</h2>
          <p className="text-ink-soft">
            Jobs for this truck are listed on the{" "}
            <Link href="/jobs" className={linkClass}>
              Jobs page
            </Link>
            .
          </p>
        </section>
      </div>
    </section>
  );
}
