import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { undoMove, undoSchema } from "@/server/jobs/undo";

/** Takes back the caller's own last move of a card, within the undo window. Every staff role works the board. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    const input = await readJson(req, undoSchema);
    return json(await undoMove(getDb(), actor, id, input));
  });
}
