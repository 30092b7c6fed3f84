import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";
import { loadBoard } from "@/server/jobs/board";
import { boardFilterSchema } from "@/server/jobs/schemas";

export const dynamic = "force-dynamic";

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const params = Object.fromEntries(new URL(req.url).searchParams.entries());
    const filter = boardFilterSchema.parse(Object.fromEntries(Object.entries(params).filter(([, v]) => v !== "")));
    return json(await loadBoard(getDb(), filter));
  });
}
