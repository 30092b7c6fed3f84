import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { assertSameOrigin, json, parseId, respond } from "@/server/http/respond";
import { issueStatusLink, listStatusLinks } from "@/server/status/links";

/** The job's status links, without their tokens (only their hashes are kept). */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    return json({ links: await listStatusLinks(getDb(), id) });
  });
}

/** Issues a new link (the job's other links stop working) and answers its URL, this once. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id, "Job");
    const link = await issueStatusLink(getDb(), actor, id);
    return json({ link }, { status: 201, headers: { "Cache-Control": "no-store" } });
  });
}
