import { getDb } from "@/db";
import { requirePageStaff } from "@/server/auth/session";
import { listStaff } from "@/server/staff/queries";
import { StaffManager } from "./staff-manager";

export const metadata = { title: "Staff" };

export default async function StaffPage() {
  const owner = await requirePageStaff(["owner"]);
  const staff = await listStaff(getDb());
  return (
    <section className="space-y-4">
      <h1 className="text-2xl font-bold">Staff</h1>
      <p className="max-w-2xl text-ink-soft">Everyone who signs in to the shop. Deactivating someone or resetting their password signs them out on every device at once. Each person changes their own password on their Account page.</p>
      <StaffManager initial={staff} selfId={owner.id} />
    </section>
  );
}
