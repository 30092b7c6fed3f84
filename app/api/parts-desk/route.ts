import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";
import { loadPartsDesk } from "@/server/parts/desk";
import { COST_ROLES } from "@/server/parts/mutations";

/** The parts desk as JSON: lines to order and on order by supplier, overdue, received this week, newest orders. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, COST_ROLES);
    return json(await loadPartsDesk(getDb()));
  });
}
