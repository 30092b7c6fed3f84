import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";
import { existingJobId } from "@/server/jobs/queries";
import { decodeLine } from "@/server/photos/decode-line";

/** Where the signed-in person's photos of this job stand in the server's line to be checked and resized. */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const user = await requireStaff(req);
    const jobId = await existingJobId(getDb(), (await ctx.params).id);
    const line = decodeLine({ jobId, uploadedBy: user.id }).map(({ name, state, ahead }) => ({ name, state, ahead }));
    return json({ line });
  });
}
