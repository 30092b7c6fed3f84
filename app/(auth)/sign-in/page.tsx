import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getDb } from "@/db";
import { currentStaff } from "@/server/auth/session";
import { staffCount } from "@/server/staff/queries";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

export default async function SignInPage() {
  if ((await staffCount(getDb())) === 0) redirect("/first-run");
  if (await currentStaff()) redirect("/");
  return (
    <section className="rounded-xl border border-line bg-panel p-6 shadow-sm">
      <h1 className="mb-4 text-2xl font-bold">Sign in</h1>
      <SignInForm />
    </section>
  );
}
