import { showStoredDate } from "@/server/http/calendar-date";
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { JobList } from "@/components/job-list";
import { getDb } from "@/db";
import { currentStaff, requirePageStaff } from "@/server/auth/session";
import { truckRecords, withDeliveredDays } from "@/server/jobs/history";
import { listJobs } from "@/server/jobs/queries";
import { listCustomerChoices } from "@/server/customers/queries";
import { findTruck } from "@/server/trucks/queries";
import { buttonClass } from "@/components/styles";
import { BackLink, Facts, idFromParam, linkClass } from "../../customers/facts";
import { TruckForm } from "../truck-form";

export async function generateMetadata({ params }: { params: Promise<{ id: string }> }): Promise<Metadata> {
  const id = idFromParam((await params).id);
  // Names reach the tab only for signed-in staff; the page itself checks access as before.
  const truck = id !== null && (await currentStaff()) ? await findTruck(getDb(), id) : undefined;
  return { title: truck ? `Unit ${truck.unitNumber} · ${truck.customerName}` : "Truck" };
}

export default async function TruckPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageStaff();
  const id = idFromParam((await params).id);
  const truck = id === null ? undefined : await findTruck(getDb(), id);
  if (!truck) notFound();
  const canEdit = user.role !== "tech";
  const [jobs, records] = await Promise.all([
    listJobs(getDb(), { truckId: truck.id, sort: "newest", limit: 2000 }).then((rows) => withDeliveredDays(getDb(), rows)),
    truckRecords(getDb(), truck.id),
  ]);

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

      <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[minmax(0,1fr)_420px]">
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

        <section aria-labelledby="jobs-heading" className="order-first space-y-3 rounded-lg border border-line bg-panel p-4 lg:order-none">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="jobs-heading" className="text-lg font-bold">
              Jobs <span className="font-normal text-ink-soft">({jobs.length})</span>
            </h2>
            {canEdit && (
              <Link href={`/jobs/new?truckId=${truck.id}`} className={buttonClass.primary}>
                <span aria-hidden="true">+</span> New job
              </Link>
            )}
          </div>
          <JobList rows={jobs} hide={["customer", "truck"]} caption={`Jobs for unit ${truck.unitNumber}`} narrow empty={<p className="text-ink-soft">No jobs for this truck yet.</p>} />
        </section>
      </div>

      <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[minmax(0,1fr)_420px]">
        <section aria-labelledby="photos-heading" className="space-y-3 rounded-lg border border-line bg-panel p-4">
          <h2 id="photos-heading" className="text-lg font-bold">
            Photos <span className="font-normal text-ink-soft">({records.photos.length})</span>
          </h2>
          {records.photos.length === 0 ? (
            <p className="text-ink-soft">No photos of this truck&rsquo;s work yet; they are taken on each job&rsquo;s page.</p>
          ) : (
            <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 xl:grid-cols-4">
              {records.photos.map((p) => (
                <li key={p.id}>
                  <Link href={`/jobs/${p.jobId}#photos`} className="block space-y-1 rounded-md hover:bg-bay-50">
                    {/* eslint-disable-next-line @next/next/no-img-element -- the shop's own resized thumbnail */}
                    <img src={`/api/photos/${p.id}?size=thumb`} alt={p.caption || `Photo on ${p.workOrder}`} width={p.width} height={p.height} loading="lazy" className="aspect-[4/3] h-auto w-full rounded-md object-cover" />
                    <span className="block truncate text-sm">{p.caption || "No caption"}</span>
                    <span className="block text-xs text-ink-soft">{p.workOrder} · {showStoredDate(p.createdAt, "d MMM yyyy")}</span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
        <section aria-labelledby="specs-heading" className="space-y-3 rounded-lg border border-line bg-panel p-4">
          <h2 id="specs-heading" className="text-lg font-bold">
            Kit specs <span className="font-normal text-ink-soft">({records.specs.length})</span>
          </h2>
          {records.specs.length === 0 ? (
            <p className="text-ink-soft">No kit spec saved on this truck&rsquo;s jobs yet.</p>
          ) : (
            <ul className="divide-y divide-line">
              {records.specs.map((k) => (
                <li key={k.id}>
                  <Link href={`/jobs/${k.jobId}#kit-spec`} className="flex min-h-11 flex-col justify-center py-1 hover:bg-bay-50">
                    <span className="font-semibold text-bay-900 underline">{k.workOrder}: kit spec version {k.version}</span>
                    <span className="text-sm text-ink-soft">Saved {showStoredDate(k.savedAt, "d MMM yyyy")}{k.savedBy ? ` by ${k.savedBy}` : ""}</span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
    </section>
  );
}
