import { NotBuiltYet } from "@/components/placeholder";
import { requirePageStaff } from "@/server/auth/session";

export const metadata = { title: "Coating" };

export default async function CoatingPage() {
  await requirePageStaff();
  return <NotBuiltYet title="Outside coating" what="Coating runs (parts sent to the powder coater, promised and received dates, receiving inspection and each vendor's turnaround record) will live here. Nothing on this page works yet." />;
}
