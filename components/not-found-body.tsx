import Link from "next/link";
import { buttonClass } from "./styles";

/** What a signed-in person sees for a page or record that is not there, with ways back. */
export function NotFoundBody() {
  return (
    <section className="max-w-xl space-y-3 py-6">
      <h1 className="text-2xl font-bold">Nothing here</h1>
      <p>
        This page or record does not exist. It may have been deleted, or the address was mistyped or cut short when it was copied.
      </p>
      <div className="flex flex-wrap gap-2">
        <Link href="/board" className={buttonClass.primary}>Go to the board</Link>
        <Link href="/jobs" className={buttonClass.secondary}>Find a job</Link>
      </div>
    </section>
  );
}
