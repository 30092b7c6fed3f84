import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { json, parseId, respond } from "@/server/http/respond";
import { listJobPhotos } from "@/server/photos/queries";

export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    const db = getDb();
    const job = await db.selectFrom("job").select("id").where("id", "=", id).executeTakeFirst();
    if (!job) throw notFound("That job");
    return json({ photos: await listJobPhotos(db, id) });
  });
}
