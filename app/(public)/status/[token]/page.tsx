import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { cache } from "react";
import { getDb } from "@/db";
import { repliesRead } from "@/server/email/env";
import { noteLinkOpened, readStatusPage } from "@/server/status/queries";
import { customerQuotes } from "@/server/money/customer-quote";
import { customerPayment } from "@/server/money/customer-payment";
import { PaySection } from "./pay-section";
import { QuoteAnswer } from "./quote-answer";
import { StatusView } from "./status-view";

export const dynamic = "force-dynamic";

/** One read per request, shared by the page and its title. */
const loadStatus = cache((token: string) => readStatusPage(getDb(), token));

// The URL is the key to the page: keep it out of search engines and out of Referer headers.
// The customer knows the shop, not the software, so the tab carries the unit and the shop's name.
export async function generateMetadata({ params }: { params: Promise<{ token: string }> }): Promise<Metadata> {
  const { token } = await params;
  const { view, shop } = await loadStatus(token);
  return {
    title: { absolute: view ? `Unit ${view.truck.unitNumber} · ${view.job.workOrder} · ${shop.name}` : `Status link not working · ${shop.name}` },
    description: view ? `Progress of work order ${view.job.workOrder} (${view.job.description}) on unit ${view.truck.unitNumber} at ${shop.name}` : null,
    robots: { index: false, follow: false, nocache: true },
    referrer: "no-referrer",
  };
}

export default async function StatusPage({ params, searchParams }: { params: Promise<{ token: string }>; searchParams?: Promise<{ paid?: string; checkout?: string }> }) {
  const { token } = await params;
  const back = (await searchParams) ?? {};
  const returned = back.paid === "deposit" || back.paid === "invoice" ? back.paid : back.checkout === "cancelled" ? "cancelled" : null;
  const { link, view, shop } = await loadStatus(token);
  // Unknown, turned off and expired links all end here: the not-found page says so and gives the shop's phone.
  if (link.state !== "active" || !view) notFound();
  noteLinkOpened(getDb(), link);
  const quotes = await customerQuotes(getDb(), link.jobId);
  const payment = await customerPayment(getDb(), link.jobId);
  const price = quotes.length ? (
    <>
      <QuoteAnswer token={token} initialQuotes={quotes} timeZone={shop.timeZone} />
      {payment && <PaySection token={token} payment={payment} returned={returned} />}
    </>
  ) : null;
  return <StatusView view={view} token={token} repliesRead={repliesRead()} price={price} />;
}
