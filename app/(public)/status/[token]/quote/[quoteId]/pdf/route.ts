import { getDb } from "@/db";
import { ApiError } from "@/server/http/errors";
import { parseId, respond } from "@/server/http/respond";
import { customerQuotePdf } from "@/server/money/customer-quote";
import { pdfResponse } from "@/server/money/quote-pdf";
import { openStatusLink } from "@/server/status/queries";

export const dynamic = "force-dynamic";

/** The customer's copy of a quote or change order the shop sent them, from their status link. */
export async function GET(_req: Request, ctx: { params: Promise<{ token: string; quoteId: string }> }) {
  return respond(async () => {
    const { token, quoteId } = await ctx.params;
    const db = getDb();
    const link = await openStatusLink(db, token);
    if (link.state !== "active") throw new ApiError("not_found", "This status link no longer works. Ask the shop for a new one.");
    return pdfResponse(await customerQuotePdf(db, link.jobId, parseId(quoteId, "Quote")));
  });
}
