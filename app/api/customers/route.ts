import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { createCustomer } from "@/server/customers/mutations";
import { listCustomers } from "@/server/customers/queries";
import { customerListQuerySchema, newCustomerSchema } from "@/server/customers/schemas";
import { readQuery } from "@/server/customers/search";
import { json, readJson, respond } from "@/server/http/respond";

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const query = readQuery(req, customerListQuerySchema);
    return json({ customers: await listCustomers(getDb(), query) });
  });
}

export async function POST(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const input = await readJson(req, newCustomerSchema);
    return json(await createCustomer(getDb(), input), { status: 201 });
  });
}
