import { getDb } from "@/db";
import { existingJobId } from "@/server/jobs/queries";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { saveKitSpec } from "@/server/kit-spec/mutations";
import { latestKitSpec } from "@/server/kit-spec/queries";
import { kitSpecSaveSchema } from "@/server/kit-spec/schemas";

export const dynamic = "force-dynamic";

export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const db = getDb();
    const id = await existingJobId(db, (await ctx.params).id);
    return json({ spec: await latestKitSpec(db, id) });
  });
}

// Office and owner specify the kit; a tech builds to it.
export async function PUT(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Job");
    const save = await readJson(req, kitSpecSaveSchema);
    return json({ spec: await saveKitSpec(getDb(), actor, id, save) });
  });
}
