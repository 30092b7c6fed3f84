import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { assertSameOrigin, json, parseId, readJson, respond } from "@/server/http/respond";
import { deletePart, patchPart } from "@/server/records/mutations";
import { findPart, listLeakTests } from "@/server/records/queries";
import { partPatchSchema } from "@/server/records/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Part");
    const db = getDb();
    const part = await findPart(db, id);
    if (!part) throw notFound("That part");
    return json({ part, leakTests: await listLeakTests(db, { partId: id }) });
  });
}

/**
 * Any staff member edits a part or marks it reworked (which voids its earlier tests and coating);
 * taking it off the leak-test or coating list, or changing its kind, is for the office or owner.
 */
export async function PATCH(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Part");
    const patch = await readJson(req, partPatchSchema);
    return json({ part: await patchPart(getDb(), actor, id, patch) });
  });
}

/** The office or owner removes a part added by mistake, while nothing is recorded against it. */
export async function DELETE(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id, "Part");
    await deletePart(getDb(), actor, id);
    return new Response(null, { status: 204 });
  });
}
