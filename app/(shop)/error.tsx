"use client";

import Link from "next/link";
import { useEffect, useRef } from "react";
import { buttonClass } from "@/components/styles";

/**
 * Something broke while showing a shop page. The menu stays around it, so the way back is always
 * there.
 */
export default function ShopError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    document.title = "Something went wrong · Baywright";
    heading.current?.focus();
  }, []);
  return (
    <section className="max-w-xl space-y-3 py-6" role="alert">
      <h1 ref={heading} tabIndex={-1} className="text-2xl font-bold focus:outline-none">This page could not be shown</h1>
      <p>
        Something went wrong on the server while loading it. Loading a page changes nothing in the shop's records, so trying again is safe; if it keeps happening, tell
        whoever looks after Baywright in the shop
        {error.digest ? <> and give them this reference: <code className="rounded bg-bay-50 px-1 font-semibold">{error.digest}</code></> : null}.
      </p>
      <div className="flex flex-wrap gap-2">
        <button type="button" className={buttonClass.primary} onClick={reset}>Try again</button>
        <Link href="/board" className={buttonClass.secondary}>Go to the board</Link>
      </div>
    </section>
  );
}
