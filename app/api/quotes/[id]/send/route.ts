import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { sendQuote } from "@/server/money/quote-mutations";

const sendSchema = z.strictObject({}, { error: "Send an empty JSON object: {}." });

/** Sends a draft to the customer: from now on it is never changed. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Quote");
    await readJson(req, sendSchema);
    return json({ quote: await sendQuote(getDb(), actor, id) });
  });
}
