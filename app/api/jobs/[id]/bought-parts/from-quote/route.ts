import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { boughtPartsFromQuote } from "@/server/parts/mutations";

type Ctx = { params: Promise<{ id: string }> };

/** Lists the part lines of the job's approved quote and change orders that are not listed yet. */
export async function POST(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const jobId = parseId((await ctx.params).id, "Job");
    await readJson(req, z.strictObject({}, { error: "Send an empty JSON object: the parts come from the approved quote." }));
    return json({ parts: await boughtPartsFromQuote(getDb(), actor, jobId) }, { status: 201 });
  });
}
