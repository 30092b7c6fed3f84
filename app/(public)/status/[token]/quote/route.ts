import { getDb } from "@/db";
import { clientAddress } from "@/server/auth/rate-limit";
import { json, readJson, respond } from "@/server/http/respond";
import { answerQuote, customerQuotes, quoteAnswerSchema } from "@/server/money/customer-quote";
import { jobOfWorkingLink } from "@/server/status/queries";

/**
 * The truck owner approves or declines a quote on their status link. The link is the key, under
 * the same rules as the page: an unknown link is "not found", a turned-off or expired one says so.
 */
export async function POST(req: Request, ctx: { params: Promise<{ token: string }> }) {
  return respond(async () => {
    const { token } = await ctx.params;
    const db = getDb();
    const jobId = await jobOfWorkingLink(db, token);
    const answer = await readJson(req, quoteAnswerSchema);
    await answerQuote(db, jobId, answer, clientAddress(req));
    return json({ quotes: await customerQuotes(db, jobId) });
  });
}
