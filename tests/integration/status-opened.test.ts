import { addMinutes } from "date-fns";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import StatusPage from "@/app/(public)/status/[token]/page";
import * as jobLinks from "@/app/api/jobs/[id]/status-links/route";
import { dataGeneration } from "@/db";
import { flushLinkOpens, queueLinkOpened } from "@/server/status/opened";
import { readStatusPage } from "@/server/status/queries";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function issuedLink(jobId: number) {
  const office = await makeStaff(db(), "office");
  const res = await jobLinks.POST(request(`/api/jobs/${jobId}/status-links`, { method: "POST", cookie: await sessionCookieFor(office.id) }), params({ id: String(jobId) }));
  const { link } = await readBody(res);
  return { id: link.id as number, token: (link.url as string).split("/status/")[1] };
}

const openedAt = async (id: number) => (await db().selectFrom("status_link").select("last_opened_at").where("id", "=", id).executeTakeFirstOrThrow()).last_opened_at;

describe("a status link being opened", () => {
  it("is never written while the page renders: the view is a read, the note is written a moment later", async () => {
    await ensureShop(db());
    const job = await makeJob(db(), { stage: "fabricate" });
    const link = await issuedLink(job.id);
    const before = dataGeneration();
    const html = renderToStaticMarkup(await StatusPage({ params: Promise.resolve({ token: link.token }) }));
    expect(html).toContain("Unit");
    expect(dataGeneration()).toBe(before);
    expect(await openedAt(link.id)).toBeNull();
    await flushLinkOpens();
    expect(await openedAt(link.id)).not.toBeNull();
  });

  it("is written at most once an hour per link, however often it is viewed", async () => {
    const job = await makeJob(db(), { stage: "install" });
    const link = await issuedLink(job.id);
    const t0 = new Date("2031-04-01T14:00:00.000Z");
    const view = async (at: Date) => {
      const { link: opened } = await readStatusPage(db(), link.token, at);
      if (opened.state !== "active") throw new Error(`link is ${opened.state}`);
      queueLinkOpened(db(), opened, at);
      await flushLinkOpens();
    };
    await view(t0);
    expect(await openedAt(link.id)).toBe(t0.toISOString());
    for (const minutes of [1, 20, 59]) await view(addMinutes(t0, minutes));
    expect(await openedAt(link.id)).toBe(t0.toISOString());
    await view(addMinutes(t0, 61));
    expect(await openedAt(link.id)).toBe(addMinutes(t0, 61).toISOString());
  });

  it("reads the whole page in one statement: link, job, truck, timeline, photos, shop", async () => {
    const job = await makeJob(db(), { stage: "wire" });
    const link = await issuedLink(job.id);
    const before = dataGeneration();
    const page = await readStatusPage(db(), link.token);
    expect(page.link).toMatchObject({ state: "active", jobId: job.id });
    expect(page.view?.stage).toBe("wire");
    expect(page.shop.name).toBe("Test Upfit");
    expect(dataGeneration()).toBe(before);
    const unknown = await readStatusPage(db(), "A".repeat(43));
    expect(unknown).toMatchObject({ link: { state: "unknown" }, view: null, shop: { name: "Test Upfit", phone: "(555) 010-0000" } });
  });
});
