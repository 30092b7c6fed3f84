import "server-only";
import type { Transaction } from "kysely";
import type { DB } from "@/db";
import type { Database } from "@/db/schema";
import { ApiError, notFound } from "@/server/http/errors";
import { findCustomer, listContacts } from "./queries";
import type { CustomerPatch, NewCustomerInput } from "./schemas";

type Trx = Transaction<Database>;
type ContactInput = NewCustomerInput["contacts"][number] & { id?: number };

function contactRow(customerId: number, c: ContactInput) {
  return { customer_id: customerId, name: c.name, email: c.email, phone: c.phone, receives_email: c.receivesEmail ? 1 : 0 };
}

export async function createCustomer(db: DB, input: NewCustomerInput) {
  const id = await db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto("customer")
      .values({ kind: input.kind, name: input.name, phone: input.phone, email: input.email, notes: input.notes, created_at: new Date().toISOString() })
      .returning("id")
      .executeTakeFirstOrThrow();
    if (input.contacts.length) await trx.insertInto("contact").values(input.contacts.map((c) => contactRow(row.id, c))).execute();
    return row.id;
  });
  return { customer: (await findCustomer(db, id))!, contacts: await listContacts(db, id) };
}

/**
 * The sent list becomes the customer's contacts: rows that carry an id are kept (and updated),
 * rows without one are added, and contacts left out are removed.
 */
async function replaceContacts(trx: Trx, customerId: number, contacts: ContactInput[]) {
  const existing = new Set(
    (await trx.selectFrom("contact").select("id").where("customer_id", "=", customerId).execute()).map((c) => c.id),
  );
  const fields: Record<string, string[]> = {};
  contacts.forEach((c, i) => {
    if (c.id !== undefined && !existing.has(c.id)) fields[`contacts.${i}.id`] = ["This contact is not on this customer's list; reload the page and try again."];
  });
  if (Object.keys(fields).length) throw new ApiError("validation", "A contact in the list does not belong to this customer; reload the page and try again.", { fields });

  const kept = contacts.flatMap((c) => (c.id === undefined ? [] : [c.id]));
  let removal = trx.deleteFrom("contact").where("customer_id", "=", customerId);
  if (kept.length) removal = removal.where("id", "not in", kept);
  await removal.execute();
  for (const c of contacts) {
    if (c.id === undefined) await trx.insertInto("contact").values(contactRow(customerId, c)).execute();
    else await trx.updateTable("contact").set(contactRow(customerId, c)).where("id", "=", c.id).execute();
  }
}

export async function updateCustomer(db: DB, id: number, patch: CustomerPatch) {
  await db.transaction().execute(async (trx) => {
    const found = await trx.selectFrom("customer").select("id").where("id", "=", id).executeTakeFirst();
    if (!found) throw notFound("That customer");
    const set = {
      ...(patch.kind !== undefined ? { kind: patch.kind } : {}),
      ...(patch.name !== undefined ? { name: patch.name } : {}),
      ...(patch.phone !== undefined ? { phone: patch.phone } : {}),
      ...(patch.email !== undefined ? { email: patch.email } : {}),
      ...(patch.notes !== undefined ? { notes: patch.notes } : {}),
    };
    if (Object.keys(set).length) await trx.updateTable("customer").set(set).where("id", "=", id).execute();
    if (patch.contacts) await replaceContacts(trx, id, patch.contacts);
  });
  return { customer: (await findCustomer(db, id))!, contacts: await listContacts(db, id) };
}
