import "server-only";
import type { Transaction } from "kysely";
import type { DB } from "@/db";
import type { Database } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import type { EmailSettingsInput } from "./schemas";

type Reader = DB | Transaction<Database>;

export interface JobEmailSettings {
  emailOff: boolean;
  /** false: every contact of the customer who gets e-mail updates; true: exactly the chosen ones. */
  recipientsChosen: boolean;
  contacts: { id: number; name: string; email: string; receivesEmail: boolean; chosen: boolean; gets: boolean }[];
}

export async function jobEmailSettings(db: Reader, jobId: number): Promise<JobEmailSettings> {
  const job = await db.selectFrom("job").select(["id", "customer_id"]).where("id", "=", jobId).executeTakeFirst();
  if (!job) throw new ApiError("not_found", "That job was not found.");
  const [setting, contacts, chosen] = await Promise.all([
    db.selectFrom("job_email_setting").select(["email_off", "recipients_chosen"]).where("job_id", "=", jobId).executeTakeFirst(),
    db.selectFrom("contact").select(["id", "name", "email", "receives_email"]).where("customer_id", "=", job.customer_id).orderBy("id").execute(),
    db.selectFrom("job_email_recipient").select("contact_id").where("job_id", "=", jobId).execute(),
  ]);
  const recipientsChosen = setting?.recipients_chosen === 1;
  const chosenIds = new Set(chosen.map((c) => c.contact_id));
  return {
    emailOff: setting?.email_off === 1,
    recipientsChosen,
    contacts: contacts.map((c) => {
      const isChosen = chosenIds.has(c.id);
      const hasAddress = c.email.trim() !== "";
      return { id: c.id, name: c.name, email: c.email, receivesEmail: c.receives_email === 1, chosen: isChosen, gets: hasAddress && (recipientsChosen ? isChosen : c.receives_email === 1) };
    }),
  };
}

/** The addresses a customer e-mail for this job goes to now, and the names of the contacts it greets. */
export async function recipientsFor(db: Reader, jobId: number): Promise<{ emailOff: boolean; to: string[]; names: string[] }> {
  const settings = await jobEmailSettings(db, jobId);
  const getting = settings.contacts.filter((c) => c.gets);
  const to = [...new Set(getting.map((c) => c.email.trim().toLowerCase()))];
  const names = [...new Set(getting.map((c) => c.name.trim()).filter(Boolean))];
  return { emailOff: settings.emailOff, to, names };
}

export async function saveJobEmailSettings(db: DB, actor: StaffUser, jobId: number, input: EmailSettingsInput) {
  await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select(["id", "customer_id"]).where("id", "=", jobId).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    const ids = [...new Set(input.contactIds)];
    if (ids.length) {
      const found = await trx.selectFrom("contact").select(["id", "email"]).where("customer_id", "=", job.customer_id).where("id", "in", ids).execute();
      const bad = ids.filter((id) => !found.some((c) => c.id === id));
      if (bad.length) throw new ApiError("validation", "Choose contacts of this job's customer.", { fields: { contactIds: [`Not a contact of this customer: ${bad.join(", ")}.`] } });
      const noAddress = found.filter((c) => c.email.trim() === "");
      if (noAddress.length) throw new ApiError("validation", "A chosen contact has no e-mail address; add one on the customer page first.", { fields: { contactIds: ["That contact has no e-mail address."] } });
    }
    const at = new Date().toISOString();
    await trx
      .insertInto("job_email_setting")
      .values({ job_id: jobId, email_off: input.emailOff ? 1 : 0, recipients_chosen: 1, updated_at: at, updated_by: actor.id })
      .onConflict((oc) => oc.column("job_id").doUpdateSet({ email_off: input.emailOff ? 1 : 0, recipients_chosen: 1, updated_at: at, updated_by: actor.id }))
      .execute();
    await trx.deleteFrom("job_email_recipient").where("job_id", "=", jobId).execute();
    if (ids.length) await trx.insertInto("job_email_recipient").values(ids.map((contact_id) => ({ job_id: jobId, contact_id }))).execute();
  });
  return jobEmailSettings(db, jobId);
}
