import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { json, parseId, readJson, respond } from "@/server/http/respond";
import { updateTruck } from "@/server/trucks/mutations";
import { findTruck } from "@/server/trucks/queries";
import { truckPatchSchema } from "@/server/trucks/schemas";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Truck");
    const truck = await findTruck(getDb(), id);
    if (!truck) throw notFound("That truck");
    return json({ truck });
  });
}

export async function PATCH(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Truck");
    const patch = await readJson(req, truckPatchSchema);
    return json({ truck: await updateTruck(getDb(), id, patch) });
  });
}
