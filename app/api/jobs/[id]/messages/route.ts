import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { emailConfigured } from "@/server/email/env";
import { listMessages } from "@/server/email/messages";
import { notFound } from "@/server/http/errors";
import { json, parseId, respond } from "@/server/http/respond";

/** Every customer e-mail of the job with its delivery state. */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    const db = getDb();
    const job = await db.selectFrom("job").select("id").where("id", "=", id).executeTakeFirst();
    if (!job) throw notFound("That job");
    return json({ messages: await listMessages(db, id), emailConfigured: emailConfigured() });
  });
}
