import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { addPriceItem, listPriceItems } from "@/server/money/price-list";
import { priceItemSchema } from "@/server/money/schemas";

export const dynamic = "force-dynamic";

// The office prices quotes from the list; only the owner changes it.
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const all = new URL(req.url).searchParams.get("all") === "1";
    return json({ items: await listPriceItems(getDb(), { includeInactive: all }) });
  });
}

export async function POST(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const input = await readJson(req, priceItemSchema);
    return json({ item: await addPriceItem(getDb(), owner, input) }, { status: 201 });
  });
}
