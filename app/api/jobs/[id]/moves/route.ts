import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { moveJob } from "@/server/jobs/mutations";
import { moveSchema } from "@/server/jobs/schemas";
import { formerPlace, rememberFormerPlace } from "@/server/jobs/undo";

/** Moves a card to a stage (or to another place in its column). Every staff role works the board. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    const move = await readJson(req, moveSchema);
    const db = getDb();
    // Where the card stood, kept for its mover's undo.
    const place = await formerPlace(db, id);
    const result = await moveJob(db, actor, id, move);
    rememberFormerPlace(result.eventId, place);
    return json(result);
  });
}
