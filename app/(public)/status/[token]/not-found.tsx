import type { Metadata } from "next";
import { getDb } from "@/db";
import { repliesRead } from "@/server/email/env";
import { notifySettings } from "@/server/email/settings";
import { shopContact } from "@/server/status/queries";

// The customer knows the shop, not the software: no product name in the tab (the page's own title names the shop).
export const metadata: Metadata = { title: { absolute: "Status link not working" }, robots: { index: false, follow: false }, referrer: "no-referrer" };

/** A plain page for a link that is unknown, turned off by the shop, or past its end date. */
export default async function StatusLinkNotFound() {
  const db = getDb();
  const [shop, settings] = await Promise.all([shopContact(db), notifySettings(db)]);
  return (
    <main className="mx-auto max-w-xl px-4 py-10">
      <p className="text-sm font-semibold text-bay-700">{shop.name}</p>
      <h1 className="mt-1 text-2xl font-bold">This status link no longer works</h1>
      <p className="mt-3">
        The shop may have turned it off or sent you a newer one, or it has ended: links stop working {settings.statusLinkDays} days after the truck is picked up.
      </p>
      {shop.phone ? (
        <>
          <p className="mt-3">Call the shop for news of your truck or a new link.</p>
          <a href={`tel:${shop.phone.replace(/[^0-9+]/g, "")}`} className="mt-3 inline-flex min-h-11 items-center gap-2 rounded-md bg-bay-700 px-4 py-2 font-semibold text-white">
            <span aria-hidden="true">☎</span> Call {shop.name}, {shop.phone}
          </a>
        </>
      ) : repliesRead() ? (
        <p className="mt-3">Reply to the shop&apos;s last e-mail for news of your truck or a new link.</p>
      ) : (
        <p className="mt-3">Get in touch with {shop.name} for news of your truck or a new link.</p>
      )}
    </main>
  );
}
