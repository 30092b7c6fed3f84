import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { boughtPartsFromKitSpec } from "@/server/parts/mutations";

type Ctx = { params: Promise<{ id: string }> };

/** Lists the PTO and pump the job's kit spec calls for, to be ordered. */
export async function POST(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const jobId = parseId((await ctx.params).id, "Job");
    await readJson(req, z.strictObject({}, { error: "Send an empty JSON object: the parts come from the kit spec." }));
    return json({ parts: await boughtPartsFromKitSpec(getDb(), actor, jobId) }, { status: 201 });
  });
}
