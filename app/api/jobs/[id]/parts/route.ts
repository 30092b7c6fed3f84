import { getDb } from "@/db";
import { existingJobId } from "@/server/jobs/queries";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { createPart } from "@/server/records/mutations";
import { listParts } from "@/server/records/queries";
import { partInputSchema } from "@/server/records/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const db = getDb();
    const jobId = await existingJobId(db, (await ctx.params).id);
    return json({ parts: await listParts(db, { jobId }) });
  });
}

/** Any staff member adds parts: the fabricator lists what they build, the office what the work order calls for. */
export async function POST(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const jobId = parseId((await ctx.params).id, "Job");
    const input = await readJson(req, partInputSchema);
    return json({ part: await createPart(getDb(), jobId, input) }, { status: 201 });
  });
}
