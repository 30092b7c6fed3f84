import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { wakeDispatcher } from "@/server/email/loop";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { sendQuote } from "@/server/money/quote-mutations";

const sendSchema = z.strictObject({}, { error: "Send an empty JSON object: {}." });

/** Sends a draft to the customer: from now on it is never changed. Its e-mail with the PDF goes at once. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Quote");
    await readJson(req, sendSchema);
    const sent = await sendQuote(getDb(), actor, id);
    wakeDispatcher();
    return json(sent);
  });
}
