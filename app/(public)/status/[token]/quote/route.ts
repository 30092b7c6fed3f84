import { getDb } from "@/db";
import { clientAddress } from "@/server/auth/rate-limit";
import { ApiError } from "@/server/http/errors";
import { json, readJson, respond } from "@/server/http/respond";
import { answerQuote, customerQuotes, quoteAnswerSchema } from "@/server/money/customer-quote";
import { openStatusLink } from "@/server/status/queries";

/**
 * The truck owner approves or declines a quote on their status link. The link is the key, under
 * the same rules as the page: an unknown link is "not found", a turned-off or expired one says so.
 */
export async function POST(req: Request, ctx: { params: Promise<{ token: string }> }) {
  return respond(async () => {
    const { token } = await ctx.params;
    const db = getDb();
    const link = await openStatusLink(db, token);
    if (link.state === "revoked" || link.state === "expired") throw new ApiError("not_found", "This status link no longer works. Ask the shop for a new one.");
    if (link.state !== "active") throw new ApiError("not_found", "Not found.");
    const answer = await readJson(req, quoteAnswerSchema);
    await answerQuote(db, link.jobId, answer, clientAddress(req));
    return json({ quotes: await customerQuotes(db, link.jobId) });
  });
}
