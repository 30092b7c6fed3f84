import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { createVendor } from "@/server/records/mutations";
import { vendorRecords } from "@/server/records/queries";
import { vendorInputSchema } from "@/server/records/schemas";

/** The coaters, each with its record over the last 90 days. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    return json({ vendors: await vendorRecords(getDb()) });
  });
}

/** The office keeps the vendors list. */
export async function POST(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["owner", "office"]);
    const input = await readJson(req, vendorInputSchema);
    return json({ vendor: await createVendor(getDb(), input) }, { status: 201 });
  });
}
