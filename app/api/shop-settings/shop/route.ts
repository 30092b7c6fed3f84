import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { shopDetailsSchema } from "@/server/shop/schemas";
import { saveShopDetails, shopDetails } from "@/server/shop/settings";

/** The shop's details: name, phone, address, time zone, holidays, work-order prefix and more. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    return json({ settings: await shopDetails(getDb()) });
  });
}

/** The owner saves them all at once, with the version the form was read at. */
export async function PUT(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const input = await readJson(req, shopDetailsSchema);
    return json({ settings: await saveShopDetails(getDb(), owner, input) });
  });
}
