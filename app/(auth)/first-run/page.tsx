import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getDb } from "@/db";
import { staffCount } from "@/server/staff/queries";
import { FirstRunForm } from "./first-run-form";

export const metadata: Metadata = { title: "Set up the shop" };
export const dynamic = "force-dynamic";

export default async function FirstRunPage() {
  if ((await staffCount(getDb())) > 0) redirect("/sign-in");
  return (
    <section className="rounded-xl border border-line bg-panel p-6 shadow-sm">
      <h1 className="text-2xl font-bold">Set up your shop</h1>
      <p className="mb-4 mt-1 text-ink-soft">No one works here yet. Create the owner's account; the owner adds everyone else from the Staff page.</p>
      <FirstRunForm />
    </section>
  );
}
