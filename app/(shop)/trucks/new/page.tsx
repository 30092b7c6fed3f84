import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { listCustomerChoices } from "@/server/customers/queries";
import { ButtonLink } from "../../customers/controls";
import { BackLink, idFromParam } from "../../customers/facts";
import { TruckForm } from "../truck-form";

export const metadata = { title: "New truck" };

export default async function NewTruckPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageStaff(["office", "owner"]);
  const raw = (await searchParams).customerId;
  const wanted = typeof raw === "string" ? idFromParam(raw) : null;
  const customers = await listCustomerChoices(getDb());
  const owner = customers.find((c) => c.id === wanted);

  return (
    <section className="max-w-3xl space-y-3">
      {owner ? <BackLink href={`/customers/${owner.id}`}>{owner.name}</BackLink> : <BackLink href="/trucks">Trucks</BackLink>}
      <h1 className="text-2xl font-bold">New truck{owner ? ` for ${owner.name}` : ""}</h1>
      {customers.length === 0 ? (
        <div className="rounded-lg border-2 border-dashed border-line bg-panel p-5">
          <p className="font-semibold">Add the customer first.</p>
          <p className="mt-1 text-ink-soft">Every truck belongs to a customer.</p>
          <ButtonLink href="/customers/new" className="mt-3">
            New customer
          </ButtonLink>
        </div>
      ) : (
        <TruckForm customers={customers} customerId={owner?.id} />
      )}
    </section>
  );
}
