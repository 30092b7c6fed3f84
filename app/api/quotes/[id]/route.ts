import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { updateQuoteDraft } from "@/server/money/quote-mutations";
import { getQuote } from "@/server/money/quotes";
import { quoteUpdateSchema } from "@/server/money/schemas";

export const dynamic = "force-dynamic";

export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Quote");
    return json({ quote: await getQuote(getDb(), id) });
  });
}

/** Changes a draft's lines; a sent quote answers 409 (it is replaced by a new version, never changed). */
export async function PUT(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Quote");
    const input = await readJson(req, quoteUpdateSchema);
    return json({ quote: await updateQuoteDraft(getDb(), id, input) });
  });
}
