import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { patchJob } from "@/server/jobs/mutations";
import { predictJob } from "@/server/jobs/prediction-queries";
import { findJob, stageEvents } from "@/server/jobs/queries";
import { jobPatchSchema } from "@/server/jobs/schemas";

export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    const db = getDb();
    const job = await findJob(db, id);
    if (!job) throw notFound("That job");
    const [events, prediction] = await Promise.all([stageEvents(db, id), predictJob(db, job)]);
    return json({ job, events, prediction });
  });
}

export async function PATCH(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    const patch = await readJson(req, jobPatchSchema);
    return json({ job: await patchJob(getDb(), actor, id, patch) });
  });
}
