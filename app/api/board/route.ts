import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { respond } from "@/server/http/respond";
import { loadBoard } from "@/server/jobs/board";
import { cachedBoardJson } from "@/server/jobs/board-cache";
import { boardFilterSchema } from "@/server/jobs/schemas";

export const dynamic = "force-dynamic";

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const params = Object.fromEntries(new URL(req.url).searchParams.entries());
    const filter = boardFilterSchema.parse(Object.fromEntries(Object.entries(params).filter(([, v]) => v !== "")));
    const now = new Date();
    // The minute is part of the key: "overdue" flips at the shop's midnight even when nothing is written.
    const key = `${now.toISOString().slice(0, 16)}|${JSON.stringify(filter)}`;
    const body = await cachedBoardJson(key, () => loadBoard(getDb(), filter, now));
    return new Response(body as BodyInit, { headers: { "content-type": "application/json", "cache-control": "no-store" } });
  });
}
