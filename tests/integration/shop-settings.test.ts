import { describe, expect, it } from "vitest";
import * as route from "@/app/api/shop-settings/shop/route";
import { loadOverview } from "@/server/reports/overview";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

const form = (version: number, over: Record<string, unknown> = {}) => ({
  version,
  name: "Cold Creek Upfit",
  phone: "(555) 010-2200",
  address: "12 Quarry Lane",
  timeZone: "US/Central",
  workOrderPrefix: "cc",
  holidays: [{ day: "2026-03-12", name: "Shop closed" }],
  showPredictedDate: true,
  leakAllowedDropPsi: 0.05,
  ...over,
});

describe("the shop's settings", () => {
  it("the owner saves them at once; a stale form is refused with the current settings; nothing changed writes nothing", async () => {
    await ensureShop(db());
    const owner = await makeStaff(db(), "owner");
    const office = await makeStaff(db(), "office");
    const cookie = await sessionCookieFor(owner.id);
    const put = (body: unknown, who = cookie) => route.PUT(request("/api/shop-settings/shop", { method: "PUT", body, cookie: who }));

    const start = (await readBody(await route.GET(request("/api/shop-settings/shop", { cookie: await sessionCookieFor(office.id) })))).settings;
    expect(start.version).toBe(1);
    const saved = await put(form(1));
    expect(saved.status).toBe(200);
    const after = (await readBody(saved)).settings;
    expect(after).toMatchObject({ version: 2, name: "Cold Creek Upfit", workOrderPrefix: "CC", showPredictedDate: true, holidays: [{ day: "2026-03-12", name: "Shop closed" }] });
    const audits = await db().selectFrom("audit_event").select(["summary"]).where("subject", "=", "Shop details").execute();
    expect(audits).toHaveLength(1);
    expect(audits[0].summary).toContain("work-order prefix (WO → CC)");

    // A second person still holding version 1 is refused, and told what is there now.
    const stale = await put(form(1, { name: "Other name" }));
    expect(stale.status).toBe(409);
    const staleBody = await readBody(stale);
    expect(staleBody.error.code).toBe("stale");
    expect(staleBody.error.details.settings.name).toBe("Cold Creek Upfit");
    expect((await db().selectFrom("shop").select("name").executeTakeFirstOrThrow()).name).toBe("Cold Creek Upfit");

    // The same values again: no new version, no audit line.
    expect((await readBody(await put(form(2)))).settings.version).toBe(2);
    expect(await db().selectFrom("audit_event").select("id").where("subject", "=", "Shop details").execute()).toHaveLength(1);

    // Only the owner saves.
    expect((await put(form(2, { name: "X" }), await sessionCookieFor(office.id))).status).toBe(403);
  });

  it("refuses bad values field by field and changes nothing", async () => {
    const owner = await makeStaff(db(), "owner");
    const cookie = await sessionCookieFor(owner.id);
    const { version } = (await readBody(await route.GET(request("/api/shop-settings/shop", { cookie })))).settings;
    const cases: [Record<string, unknown>, string][] = [
      [{ timeZone: "Mars/Olympus" }, "timeZone"],
      [{ workOrderPrefix: "WO-2026" }, "workOrderPrefix"],
      [{ holidays: [{ day: "2026-02-30", name: "" }] }, "holidays.0.day"],
      [{ holidays: [{ day: "2026-12-24" }, { day: "2026-12-24" }] }, "holidays"],
      [{ name: "  " }, "name"],
      [{ leakAllowedDropPsi: 9 }, "leakAllowedDropPsi"],
    ];
    const before = await db().selectFrom("shop").selectAll().executeTakeFirstOrThrow();
    for (const [over, field] of cases) {
      const res = await route.PUT(request("/api/shop-settings/shop", { method: "PUT", body: form(version, over), cookie }));
      expect(res.status, field).toBe(400);
      const body = await readBody(res);
      expect(Object.keys(body.error.details.fields), field).toContain(field);
    }
    expect(await db().selectFrom("shop").selectAll().executeTakeFirstOrThrow()).toEqual(before);
  });

  it("a holiday saved here counts at once in business days on the overview", async () => {
    const owner = await makeStaff(db(), "owner");
    const cookie = await sessionCookieFor(owner.id);
    const job = await makeJob(db(), { stage: "fabricate" });
    await db().updateTable("job").set({ due_on: "2026-03-13" }).where("id", "=", job.id).execute();
    const now = new Date("2026-03-18T15:00:00.000Z");
    // Due Friday 13, seen Wednesday 18: Fri 13, Mon 16, Tue 17 = 3 business days late; with Monday 16 closed, 2.
    const { version } = (await readBody(await route.GET(request("/api/shop-settings/shop", { cookie })))).settings;
    await route.PUT(request("/api/shop-settings/shop", { method: "PUT", body: form(version, { holidays: [] }), cookie }));
    expect((await loadOverview(db(), now)).pastDue.jobs.find((j) => j.id === job.id)?.daysLate).toBe(3);
    await route.PUT(request("/api/shop-settings/shop", { method: "PUT", body: form(version + 1, { holidays: [{ day: "2026-03-16", name: "Closed" }] }), cookie }));
    expect((await loadOverview(db(), now)).pastDue.jobs.find((j) => j.id === job.id)?.daysLate).toBe(2);
  });
});
