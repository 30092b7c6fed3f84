import { getDb } from "@/db";
import { existingJobId } from "@/server/jobs/queries";
import { requireStaff } from "@/server/auth/session";
import { emailConfigured } from "@/server/email/env";
import { listMessages } from "@/server/email/messages";
import { json, respond } from "@/server/http/respond";

/** Every customer e-mail of the job with its delivery state. */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const db = getDb();
    const id = await existingJobId(db, (await ctx.params).id);
    return json({ messages: await listMessages(db, id), emailConfigured: emailConfigured() });
  });
}
