import type { Metadata } from "next";
import Link from "next/link";
import { Wordmark } from "@/components/mark";
import { NotFoundBody } from "@/components/not-found-body";
import { Shell } from "@/components/shell";
import { buttonClass } from "@/components/styles";
import { currentStaff } from "@/server/auth/session";

export const metadata: Metadata = { title: "Not found" };

/**
 * An address that matches no page. Signed-in staff get the shop's own frame and menu around it;
 * anyone else gets the way to the sign-in page.
 */
export default async function NotFound() {
  const user = await currentStaff();
  if (user) {
    return (
      <Shell user={user}>
        <NotFoundBody />
      </Shell>
    );
  }
  return (
    <main id="main" className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-5 py-10">
      <Wordmark />
      <h1 className="text-2xl font-bold">Nothing here</h1>
      <p>This address does not match a page. If someone sent you a link to your truck&apos;s status, ask the shop for a new one.</p>
      <div>
        <Link href="/sign-in" className={buttonClass.primary}>Staff sign-in</Link>
      </div>
    </main>
  );
}
