import Link from "next/link";
import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { shopToday } from "@/server/records/turnaround";
import { shopSettings } from "@/server/shop/queries";
import { listTechs } from "@/server/staff/queries";
import { NewJobForm } from "./new-job-form";

export const metadata = { title: "New job" };

export default async function NewJobPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  await requirePageStaff(["owner", "office"]);
  const db = getDb();
  const [customers, trucks, techs, shop] = await Promise.all([
    db.selectFrom("customer").select(["id", "name"]).orderBy("name").execute(),
    db.selectFrom("truck").select(["id", "customer_id as customerId", "unit_number as unitNumber", "description"]).orderBy("unit_number").execute(),
    listTechs(db),
    shopSettings(db),
  ]);
  const today = shopToday({ now: new Date(), timeZone: shop.timeZone });
  const sp = await searchParams;
  return (
    <section className="max-w-2xl space-y-4">
      <p className="text-sm text-ink-soft">
        <Link href="/jobs" className="underline">Jobs</Link> / New
      </p>
      <h1 className="text-2xl font-bold">New job</h1>
      {customers.length === 0 ? (
        <p>
          Add a customer and their truck first: <Link href="/customers/new" className="underline">new customer</Link>.
        </p>
      ) : (
        <NewJobForm customers={customers} trucks={trucks} techs={techs} preset={{ customerId: Number(sp.customerId) || undefined, truckId: Number(sp.truckId) || undefined }} today={today} />
      )}
    </section>
  );
}
