import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { noteLinkOpened, openStatusLink, statusView } from "@/server/status/queries";
import { StatusView } from "./status-view";

export const dynamic = "force-dynamic";

// The URL is the key to the page: keep it out of search engines and out of Referer headers.
export const metadata: Metadata = {
  title: "Your truck's progress",
  robots: { index: false, follow: false, nocache: true },
  referrer: "no-referrer",
};

export default async function StatusPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const db = getDb();
  const link = await openStatusLink(db, token);
  // Unknown, turned off and expired links all end here: the not-found page says so and gives the shop's phone.
  if (link.state !== "active") notFound();
  const view = await statusView(db, link.jobId);
  if (!view) notFound();
  await noteLinkOpened(db, link);
  return <StatusView view={view} token={token} />;
}
