import { NotBuiltYet } from "@/components/placeholder";
import { requirePageStaff } from "@/server/auth/session";

export const metadata = { title: "Wet-kit calculator" };

export default async function CalculatorPage() {
  await requirePageStaff();
  return <NotBuiltYet title="Wet-kit calculator" what="Sizing of the pump, reservoir and lines for a truck (flow, horsepower, PTO torque, reservoir volume and line velocities) will live here. Nothing on this page works yet." />;
}
