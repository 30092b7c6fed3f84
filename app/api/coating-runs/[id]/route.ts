import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { findCoatingRun } from "@/server/records/queries";
import { updateCoatingRun } from "@/server/records/run-moves";
import { coatingRunPatchSchema } from "@/server/records/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Coating run");
    const run = await findCoatingRun(getDb(), id);
    if (!run) throw notFound("That coating run");
    return json({ run });
  });
}

/**
 * Whoever unloads the parts marks the run received and records the receiving inspection (a tech
 * with the film gauge, or the office); only the office and owner change the coater's promised date.
 * With the inspection, the jobs ticked move into Install (each through the board's move).
 */
export async function PATCH(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Coating run");
    const patch = await readJson(req, coatingRunPatchSchema);
    return json(await updateCoatingRun(getDb(), actor, id, patch));
  });
}
