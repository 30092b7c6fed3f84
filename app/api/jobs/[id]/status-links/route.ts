import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { wakeDispatcher } from "@/server/email/loop";
import { issueLinkSchema } from "@/server/email/schemas";
import { assertSameOrigin, json, parseId, readJson, respond } from "@/server/http/respond";
import { issueStatusLink, listStatusLinks } from "@/server/status/links";

/** The job's status links, without their tokens (only their hashes are kept). */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    return json({ links: await listStatusLinks(getDb(), id) });
  });
}

/**
 * Issues a new link (the job's other links stop working) and answers its URL, this once. With
 * `{ "emailContacts": true }` the new link is e-mailed to the job's contacts through the outbox.
 */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id, "Job");
    // A body is optional: without one the link is issued and not e-mailed.
    const input = req.headers.get("content-type") ? await readJson(req, issueLinkSchema) : { emailContacts: false };
    const link = await issueStatusLink(getDb(), actor, id, input);
    if (link.outboxId) wakeDispatcher();
    return json({ link }, { status: 201, headers: { "Cache-Control": "no-store" } });
  });
}
