import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { updateStaff } from "@/server/staff/mutations";
import { staffPatchSchema } from "@/server/staff/schemas";

export async function PATCH(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const { id } = await ctx.params;
    const patch = await readJson(req, staffPatchSchema);
    return json({ staff: await updateStaff(getDb(), owner, id, patch) });
  });
}
