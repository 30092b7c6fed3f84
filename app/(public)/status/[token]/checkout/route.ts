import { z } from "zod";
import { getDb } from "@/db";
import { json, readJson, respond } from "@/server/http/respond";
import { startCheckout } from "@/server/money/payments";
import { jobOfWorkingLink } from "@/server/status/queries";

const checkoutSchema = z.strictObject({
  purpose: z.enum(["deposit", "invoice"], { error: "Choose to pay the deposit or the invoice." }),
});

/**
 * The truck owner starts paying the deposit or the invoice from their status link: the answer is
 * the payment service's own page to open. The link is the key, under the page's rules.
 */
export async function POST(req: Request, ctx: { params: Promise<{ token: string }> }) {
  return respond(async () => {
    const { token } = await ctx.params;
    const db = getDb();
    const jobId = await jobOfWorkingLink(db, token);
    const { purpose } = await readJson(req, checkoutSchema);
    return json(await startCheckout(db, jobId, purpose, token));
  });
}
