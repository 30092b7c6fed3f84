import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { CLOCK_CORRECTORS, correctClockEntry } from "@/server/labour/mutations";
import { clockCorrectionSchema } from "@/server/labour/schemas";

type Ctx = { params: Promise<{ id: string }> };

/** The office or owner corrects an entry's times, with a reason kept beside it and in the audit trail. */
export async function PATCH(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req, CLOCK_CORRECTORS);
    const id = parseId((await ctx.params).id, "Clock entry");
    const input = await readJson(req, clockCorrectionSchema);
    await correctClockEntry(getDb(), actor, id, input);
    return json({ ok: true });
  });
}
