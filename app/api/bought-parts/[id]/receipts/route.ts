import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { receiveBoughtPart } from "@/server/parts/mutations";
import { receiptInputSchema } from "@/server/parts/schemas";

type Ctx = { params: Promise<{ id: string }> };

/** Whoever unpacks the delivery records it: how many came; a short delivery keeps the rest on order. */
export async function POST(req: Request, ctx: Ctx) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Bought-in part");
    const { quantity } = await readJson(req, receiptInputSchema);
    return json({ part: await receiveBoughtPart(getDb(), actor, id, quantity) }, { status: 201 });
  });
}
