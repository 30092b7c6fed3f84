import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { existingJobId } from "@/server/jobs/queries";
import { canSeeCosts, createBoughtPart } from "@/server/parts/mutations";
import { listBoughtParts } from "@/server/parts/queries";
import { boughtPartInputSchema } from "@/server/parts/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    const user = await requireStaff(req);
    const db = getDb();
    const jobId = await existingJobId(db, (await ctx.params).id);
    return json({ parts: await listBoughtParts(db, jobId, { withCost: canSeeCosts(user) }) });
  });
}

/** Any staff member lists what the job needs; costs are the office's and the owner's. */
export async function POST(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const jobId = parseId((await ctx.params).id, "Job");
    const input = await readJson(req, boughtPartInputSchema);
    const part = await createBoughtPart(getDb(), actor, jobId, input);
    return json({ part }, { status: 201 });
  });
}
