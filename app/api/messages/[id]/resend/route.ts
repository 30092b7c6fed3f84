import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { wakeDispatcher } from "@/server/email/loop";
import { resendMessage } from "@/server/email/messages";
import { outboxIdSchema } from "@/server/email/schemas";
import { ApiError } from "@/server/http/errors";
import { assertSameOrigin, json, respond } from "@/server/http/respond";

/** Sends a customer e-mail again, as a new message (its own delivery state and idempotency key). */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    assertSameOrigin(req);
    const parsed = outboxIdSchema.safeParse((await ctx.params).id);
    if (!parsed.success) throw new ApiError("validation", parsed.error.issues[0].message, { fields: { id: [parsed.error.issues[0].message] } });
    const message = await resendMessage(getDb(), actor, parsed.data);
    wakeDispatcher();
    return json({ message }, { status: 201 });
  });
}
