import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { updateCustomer } from "@/server/customers/mutations";
import { customerDetail } from "@/server/customers/queries";
import { customerPatchSchema } from "@/server/customers/schemas";
import { notFound } from "@/server/http/errors";
import { json, parseId, readJson, respond } from "@/server/http/respond";

type Ctx = { params: Promise<{ id: string }> };

export async function GET(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Customer");
    const detail = await customerDetail(getDb(), id);
    if (!detail) throw notFound("That customer");
    return json(detail);
  });
}

export async function PATCH(req: Request, ctx: Ctx) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Customer");
    const patch = await readJson(req, customerPatchSchema);
    return json(await updateCustomer(getDb(), id, patch));
  });
}
