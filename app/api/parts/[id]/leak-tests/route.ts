import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { recordLeakTest } from "@/server/records/mutations";
import { findPart, listLeakTests } from "@/server/records/queries";
import { leakTestRequestSchema } from "@/server/records/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Part");
    const db = getDb();
    if (!(await findPart(db, id))) throw notFound("That part");
    return json({ leakTests: await listLeakTests(db, { partId: id }) });
  });
}

/** Any staff member records a leak test; the server computes the corrected drop and the result. */
export async function POST(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Part");
    const input = await readJson(req, leakTestRequestSchema);
    return json(await recordLeakTest(getDb(), actor, id, input), { status: 201 });
  });
}
