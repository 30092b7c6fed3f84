import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { existingJobId } from "@/server/jobs/queries";
import { createQuote } from "@/server/money/quote-mutations";
import { quotesForJob } from "@/server/money/quotes";
import { quoteCreateSchema } from "@/server/money/schemas";

export const dynamic = "force-dynamic";

export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const db = getDb();
    const id = await existingJobId(db, (await ctx.params).id);
    return json({ quotes: await quotesForJob(db, id) });
  });
}

/** A new draft quote (or change order) on the job; it goes to the customer only when sent. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Job");
    const input = await readJson(req, quoteCreateSchema);
    return json({ quote: await createQuote(getDb(), actor, id, input) }, { status: 201 });
  });
}
