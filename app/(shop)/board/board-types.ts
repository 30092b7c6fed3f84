import type { Board as ServerBoard, BoardCard as ServerCard } from "@/server/jobs/board";
import type { BoardFilter as ServerFilter } from "@/server/jobs/schemas";

export type Board = ServerBoard;
export type BoardCard = ServerCard;
export type BoardFilter = ServerFilter;

export function filterToSearch(filter: BoardFilter) {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filter)) if (v !== undefined && v !== "") params.set(k, String(v));
  return params.toString();
}
