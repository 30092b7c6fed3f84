import { requirePageStaff } from "@/server/auth/session";
import { CustomerForm } from "../customer-form";
import { BackLink } from "../facts";

export const metadata = { title: "New customer" };

export default async function NewCustomerPage() {
  await requirePageStaff(["office", "owner"]);
  return (
    <section className="max-w-4xl space-y-3">
      <BackLink href="/customers">Customers</BackLink>
      <h1 className="text-2xl font-bold">New customer</h1>
      <p className="text-ink-soft">A fleet or business, or an owner-operator. Add their trucks after saving.</p>
      <CustomerForm />
    </section>
  );
}
