import { getDb } from "@/db";
import { existingJobId } from "@/server/jobs/queries";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { saveSignOff } from "@/server/records/mutations";
import { findSignOff } from "@/server/records/queries";
import { signOffSaveSchema } from "@/server/records/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const db = getDb();
    const jobId = await existingJobId(db, (await ctx.params).id);
    return json({ signOff: await findSignOff(db, jobId) });
  });
}

/**
 * Any staff member saves the wiring & run-test sign-off: a draft until nothing is missing. The body
 * carries expectedVersion (0 before the first save); a stale one answers 409 with the current sign-off.
 */
export async function PUT(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const jobId = parseId((await ctx.params).id, "Job");
    const input = await readJson(req, signOffSaveSchema);
    return json({ signOff: await saveSignOff(getDb(), actor, jobId, input) });
  });
}
