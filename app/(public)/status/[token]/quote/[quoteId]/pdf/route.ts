import { getDb } from "@/db";
import { parseId, respond } from "@/server/http/respond";
import { customerQuotePdf } from "@/server/money/customer-quote";
import { pdfResponse } from "@/server/money/quote-pdf";
import { jobOfWorkingLink } from "@/server/status/queries";

export const dynamic = "force-dynamic";

/** The customer's copy of a quote or change order the shop sent them, from their status link. */
export async function GET(_req: Request, ctx: { params: Promise<{ token: string; quoteId: string }> }) {
  return respond(async () => {
    const { token, quoteId } = await ctx.params;
    const db = getDb();
    return pdfResponse(await customerQuotePdf(db, await jobOfWorkingLink(db, token), parseId(quoteId, "Quote")));
  });
}
