import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";

export const dynamic = "force-dynamic";

/** The smallest signed-in JSON answer: the yardstick the board's latency is measured against. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    return json({ ok: true });
  });
}
