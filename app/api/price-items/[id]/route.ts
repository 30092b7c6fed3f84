import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { updatePriceItem } from "@/server/money/price-list";
import { priceItemPatchSchema } from "@/server/money/schemas";

/** A price changed (or taken off the list) applies to quotes written from now on; sent quotes keep theirs. */
export async function PATCH(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const id = parseId((await ctx.params).id, "Price-list item");
    const patch = await readJson(req, priceItemPatchSchema);
    return json({ item: await updatePriceItem(getDb(), owner, id, patch) });
  });
}
