import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { createStaff } from "@/server/staff/mutations";
import { listStaff } from "@/server/staff/queries";
import { newStaffSchema } from "@/server/staff/schemas";

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["owner"]);
    return json({ staff: await listStaff(getDb()) });
  });
}

export async function POST(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const input = await readJson(req, newStaffSchema);
    return json({ staff: await createStaff(getDb(), owner, input) }, { status: 201 });
  });
}
