import { NotBuiltYet } from "@/components/placeholder";
import { requirePageStaff } from "@/server/auth/session";

export const metadata = { title: "Board" };

export default async function BoardPage() {
  await requirePageStaff();
  return <NotBuiltYet title="Board" what="The board of jobs moving through the stages is being built." />;
}
