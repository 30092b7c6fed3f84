import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { wakeDispatcher } from "@/server/email/loop";
import { sendNow } from "@/server/email/messages";
import { outboxIdSchema } from "@/server/email/schemas";
import { ApiError } from "@/server/http/errors";
import { assertSameOrigin, json, respond } from "@/server/http/respond";

/** Sends a message that is waiting out the quiet period after a move at once. */
export async function POST(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    assertSameOrigin(req);
    const parsed = outboxIdSchema.safeParse((await ctx.params).id);
    if (!parsed.success) throw new ApiError("validation", parsed.error.issues[0].message, { fields: { id: [parsed.error.issues[0].message] } });
    const message = await sendNow(getDb(), parsed.data);
    wakeDispatcher();
    return json({ message });
  });
}
