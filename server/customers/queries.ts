import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";
import { listTrucks } from "@/server/trucks/queries";
import { containsText } from "./search";
import type { ContactView, CustomerFacts, CustomerListQuery, CustomerListRow } from "./schemas";

export async function listCustomers(db: DB, query: CustomerListQuery = {}): Promise<CustomerListRow[]> {
  const dir = query.dir ?? "asc";
  let select = db
    .selectFrom("customer")
    .select((eb) => [
      "customer.id",
      "customer.kind",
      "customer.name",
      "customer.phone",
      "customer.email",
      eb.selectFrom("truck").whereRef("truck.customer_id", "=", "customer.id").select(eb.fn.countAll<number>().as("n")).as("truckCount"),
      // Delivered jobs have left the board; every other stage is work still in the shop.
      eb
        .selectFrom("job")
        .whereRef("job.customer_id", "=", "customer.id")
        .where("job.stage", "!=", "delivered")
        .select(eb.fn.countAll<number>().as("n"))
        .as("openJobCount"),
    ]);
  if (query.q) {
    const q = query.q;
    select = select.where((eb) =>
      eb.or([
        containsText(eb.ref("customer.name"), q),
        eb.exists(eb.selectFrom("contact").select("contact.id").whereRef("contact.customer_id", "=", "customer.id").where((c) => containsText(c.ref("contact.name"), q))),
      ]),
    );
  }
  if (query.sort === "kind") select = select.orderBy("customer.kind", dir);
  if (query.sort === "trucks") select = select.orderBy("truckCount", dir);
  select = select.orderBy(sql`customer.name collate nocase`, query.sort === "name" || !query.sort ? dir : "asc").orderBy("customer.id");
  const rows = await select.execute();
  return rows.map((r) => ({ ...r, truckCount: Number(r.truckCount ?? 0), openJobCount: Number(r.openJobCount ?? 0) }));
}

/** Id and name of every customer, for select boxes (new truck, new job). */
export function listCustomerChoices(db: DB) {
  return db.selectFrom("customer").select(["id", "name", "kind"]).orderBy(sql`name collate nocase`).orderBy("id").execute();
}

export function findCustomer(db: DB, id: number): Promise<CustomerFacts | undefined> {
  return db
    .selectFrom("customer")
    .select(["id", "kind", "name", "phone", "email", "notes", "created_at as createdAt"])
    .where("id", "=", id)
    .executeTakeFirst();
}

export async function listContacts(db: DB, customerId: number): Promise<ContactView[]> {
  const rows = await db
    .selectFrom("contact")
    .select(["id", "name", "email", "phone", "receives_email"])
    .where("customer_id", "=", customerId)
    .orderBy("id")
    .execute();
  return rows.map(({ receives_email, ...c }) => ({ ...c, receivesEmail: receives_email === 1 }));
}

/** Contacts that asked for status e-mails and have an address to send them to. */
export async function listEmailRecipients(db: DB, customerId: number) {
  return (await listContacts(db, customerId)).filter((c) => c.receivesEmail && c.email !== "");
}

/** Everything the customer page shows, or undefined for an unknown id. */
export async function customerDetail(db: DB, id: number) {
  const customer = await findCustomer(db, id);
  if (!customer) return undefined;
  const [contacts, trucks] = await Promise.all([listContacts(db, id), listTrucks(db, { customerId: id })]);
  return { customer, contacts, trucks };
}
