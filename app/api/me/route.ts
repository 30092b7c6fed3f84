import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";

export async function GET(req: Request) {
  return respond(async () => json({ user: await requireStaff(req) }));
}
