import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { loadBoard } from "@/server/jobs/board";
import { openClockOf } from "@/server/labour/queries";
import { shopSettings } from "@/server/shop/queries";
import { boardFilterSchema } from "@/server/jobs/schemas";
import { BoardView } from "./board-view";

export const metadata = { title: "Board" };

export default async function BoardPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageStaff();
  const params = await searchParams;
  const raw = Object.fromEntries(Object.entries(params).filter(([, v]) => typeof v === "string" && v !== "")) as Record<string, string>;
  const parsed = boardFilterSchema.safeParse(raw);
  const filter = parsed.success ? parsed.data : {};
  const db = getDb();
  const [initial, clock] = await Promise.all([loadBoard(db, filter), shopSettings(db).then((shop) => openClockOf(db, user.id, shop.timeZone))]);
  // A tech sent here from an office page is told why.
  return <BoardView initial={initial} initialFilter={filter} role={user.role} meId={user.id} denied={params.denied === "1"} clock={clock} />;
}
