import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";

/** Who is signed in; answered to someone holding a temporary password too, so the page can send them to /account. */
export async function GET(req: Request) {
  return respond(async () => json({ user: await requireStaff(req, undefined, { forPasswordChange: true }) }));
}
