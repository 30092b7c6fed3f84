import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { readQuery } from "@/server/customers/search";
import { json, readJson, respond } from "@/server/http/respond";
import { createTruck } from "@/server/trucks/mutations";
import { listTrucks } from "@/server/trucks/queries";
import { newTruckSchema, truckListQuerySchema } from "@/server/trucks/schemas";

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const query = readQuery(req, truckListQuerySchema);
    return json({ trucks: await listTrucks(getDb(), query) });
  });
}

export async function POST(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const input = await readJson(req, newTruckSchema);
    return json({ truck: await createTruck(getDb(), input) }, { status: 201 });
  });
}
