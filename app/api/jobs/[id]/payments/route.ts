import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { wakeDispatcher } from "@/server/email/loop";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { listPayments, recordPayment, recordPaymentSchema } from "@/server/money/payments";

/** The office records cash or a check with a reference; only the owner puts money on account. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const jobId = parseId((await ctx.params).id, "Job");
    const input = await readJson(req, recordPaymentSchema);
    const db = getDb();
    await recordPayment(db, actor, jobId, input);
    // The receipt, when the customer gets one, is waiting in the outbox: send it now.
    wakeDispatcher();
    return json({ payments: await listPayments(db, jobId) }, { status: 201 });
  });
}
