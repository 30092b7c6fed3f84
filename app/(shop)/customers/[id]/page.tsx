import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { JobList } from "@/components/job-list";
import { getDb } from "@/db";
import { currentStaff, requirePageStaff } from "@/server/auth/session";
import { customerDetail, findCustomer } from "@/server/customers/queries";
import { withDeliveredDays } from "@/server/jobs/history";
import { listJobs } from "@/server/jobs/queries";
import { CUSTOMER_KIND_LABELS } from "@/server/customers/schemas";
import { CustomerForm } from "../customer-form";
import { ButtonLink } from "../controls";
import { BackLink, Facts, idFromParam, linkClass } from "../facts";

export async function generateMetadata({ params }: { params: Promise<{ id: string }> }): Promise<Metadata> {
  const id = idFromParam((await params).id);
  // Names reach the tab only for signed-in staff; the page itself checks access as before.
  const customer = id !== null && (await currentStaff()) ? await findCustomer(getDb(), id) : undefined;
  return { title: customer ? customer.name : "Customer" };
}

export default async function CustomerPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageStaff();
  const id = idFromParam((await params).id);
  const detail = id === null ? undefined : await customerDetail(getDb(), id);
  if (!detail) notFound();
  const { customer, contacts, trucks } = detail;
  const canEdit = user.role !== "tech";
  // Every job, open and delivered, with the day each delivered one went out.
  const jobs = await withDeliveredDays(getDb(), await listJobs(getDb(), { customerId: customer.id, sort: "newest", limit: 2000 }));

  return (
    <section className="space-y-3">
      <BackLink href="/customers">Customers</BackLink>
      <div>
        <h1 className="text-2xl font-bold break-words">{customer.name}</h1>
        <p className="text-ink-soft">{CUSTOMER_KIND_LABELS[customer.kind]}</p>
      </div>

      <div className="grid grid-cols-[minmax(0,1fr)] items-start gap-6 lg:grid-cols-[minmax(0,1fr)_420px]">
        {canEdit ? (
          <CustomerForm saved={{ customer, contacts }} />
        ) : (
          <div className="space-y-5">
            <section aria-labelledby="facts-heading" className="space-y-3 rounded-lg border border-line bg-panel p-4">
              <h2 id="facts-heading" className="text-lg font-bold">Customer</h2>
              <Facts
                items={[
                  ["Kind", CUSTOMER_KIND_LABELS[customer.kind]],
                  ["Phone", customer.phone && <a href={`tel:${customer.phone}`} className={`inline-flex min-h-11 items-center ${linkClass}`}>{customer.phone}</a>],
                  ["E-mail", customer.email],
                  ["Notes", customer.notes && <span className="whitespace-pre-line">{customer.notes}</span>],
                ]}
              />
              <p className="text-sm text-ink-soft">Only the office and the owner change customer details.</p>
            </section>
            <section aria-labelledby="contacts-heading" className="space-y-3 rounded-lg border border-line bg-panel p-4">
              <h2 id="contacts-heading" className="text-lg font-bold">Contacts</h2>
              {contacts.length === 0 ? (
                <p className="text-ink-soft">No contacts.</p>
              ) : (
                <ul className="divide-y divide-line">
                  {contacts.map((c) => (
                    <li key={c.id} className="py-2">
                      <p className="font-semibold">{c.name}</p>
                      <p className="text-sm text-ink-soft">{[c.phone, c.email].filter(Boolean).join(" · ") || "No phone or e-mail"}</p>
                      <p className="text-sm">{c.receivesEmail ? "✉ Gets e-mail updates" : "No e-mail updates"}</p>
                    </li>
                  ))}
                </ul>
              )}
            </section>
          </div>
        )}

        <div className="order-first space-y-5 lg:order-none">
          <section aria-labelledby="trucks-heading" className="space-y-3 rounded-lg border border-line bg-panel p-4">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h2 id="trucks-heading" className="text-lg font-bold">
                Trucks <span className="font-normal text-ink-soft">({trucks.length})</span>
              </h2>
              {canEdit && (
                <ButtonLink href={`/trucks/new?customerId=${customer.id}`}>
                  <span aria-hidden="true">+</span> Add truck
                </ButtonLink>
              )}
            </div>
            {trucks.length === 0 ? (
              <p className="text-ink-soft">No trucks on file for this customer yet.</p>
            ) : (
              <ul className="divide-y divide-line">
                {trucks.map((t) => (
                  <li key={t.id}>
                    <Link href={`/trucks/${t.id}`} className="block min-h-11 py-2 hover:bg-paper">
                      <span className={linkClass}>Unit {t.unitNumber}</span>
                      <span className="block text-sm text-ink-soft">
                        {t.year} · {t.description || "No description"}
                      </span>
                      <span className="block text-sm tracking-wide text-ink-soft">VIN {t.vin}</span>
                    </Link>
                  </li>
                ))}
              </ul>
            )}
          </section>

          <section aria-labelledby="jobs-heading" className="space-y-3 rounded-lg border border-line bg-panel p-4">
            <div className="flex flex-wrap items-center justify-between gap-2">
              <h2 id="jobs-heading" className="text-lg font-bold">
                Jobs <span className="font-normal text-ink-soft">({jobs.length})</span>
              </h2>
              {canEdit && trucks.length > 0 && (
                <ButtonLink href={`/jobs/new?customerId=${customer.id}`}>
                  <span aria-hidden="true">+</span> New job
                </ButtonLink>
              )}
            </div>
            <JobList
              rows={jobs}
              hide={["customer"]}
              caption={`Jobs for ${customer.name}`}
              narrow
              empty={<p className="text-ink-soft">{trucks.length === 0 ? "No jobs yet. Add their truck first, then open a job for it." : "No jobs for this customer yet."}</p>}
            />
          </section>
        </div>
      </div>
    </section>
  );
}
