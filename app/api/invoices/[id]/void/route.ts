import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { jobInvoices, voidInvoice, voidInvoiceSchema } from "@/server/money/invoices";

/** The owner voids an invoice with a reason (kept, never deleted, and written to the audit trail). */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const id = parseId((await ctx.params).id, "Invoice");
    const { reason } = await readJson(req, voidInvoiceSchema);
    const db = getDb();
    const jobId = await voidInvoice(db, owner, id, reason);
    return json({ invoices: await jobInvoices(db, jobId, { includeVoid: true }) });
  });
}
