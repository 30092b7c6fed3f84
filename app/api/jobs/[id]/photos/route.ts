import { getDb } from "@/db";
import { existingJobId } from "@/server/jobs/queries";
import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";
import { listJobPhotos } from "@/server/photos/queries";

export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const db = getDb();
    const id = await existingJobId(db, (await ctx.params).id);
    return json({ photos: await listJobPhotos(db, id) });
  });
}
