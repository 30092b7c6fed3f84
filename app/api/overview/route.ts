import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";
import { loadOverview } from "@/server/reports/overview";

/** The office's overview as JSON: the same figures, each with the address of its list. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    return json(await loadOverview(getDb()));
  });
}
