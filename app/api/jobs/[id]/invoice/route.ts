import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { jobInvoices, reissueInvoice } from "@/server/money/invoices";

const makeSchema = z.strictObject({}, { error: "Send an empty JSON object: {}." });

/** Makes the job's invoice now: after a void, or for a job at Ready for pickup without one. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const jobId = parseId((await ctx.params).id, "Job");
    await readJson(req, makeSchema);
    const db = getDb();
    await reissueInvoice(db, actor.id, jobId);
    return json({ invoices: await jobInvoices(db, jobId, { includeVoid: true }) }, { status: 201 });
  });
}
