import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";
import { searchShop } from "@/server/search/search";

/** One search over jobs, trucks, customers, contacts, parts, coaters and photo captions: `?q=`. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    return json(await searchShop(getDb(), new URL(req.url).searchParams.get("q") ?? ""));
  });
}
