import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { parseId, respond } from "@/server/http/respond";
import { pdfResponse, quotePdf } from "@/server/money/quote-pdf";

export const dynamic = "force-dynamic";

/** The quote or change order as a PDF, drafts included (marked as drafts): office and owner. */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Quote");
    return pdfResponse(await quotePdf(getDb(), id));
  });
}
