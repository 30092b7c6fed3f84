import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { loadBoard } from "@/server/jobs/board";
import { boardFilterSchema } from "@/server/jobs/schemas";
import { BoardView } from "./board-view";

export const metadata = { title: "Board" };

export default async function BoardPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageStaff();
  const raw = Object.fromEntries(Object.entries(await searchParams).filter(([, v]) => typeof v === "string" && v !== "")) as Record<string, string>;
  const parsed = boardFilterSchema.safeParse(raw);
  const filter = parsed.success ? parsed.data : {};
  const initial = await loadBoard(getDb(), filter);
  return <BoardView initial={initial} initialFilter={filter} role={user.role} meId={user.id} />;
}
