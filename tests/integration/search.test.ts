import { describe, expect, it } from "vitest";
import * as searchRoute from "@/app/api/search/route";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

type Group = { kind: string; label: string; total: number; hits: { id: number; title: string; href: string }[] };

async function search(q: string): Promise<{ groups: Group[]; hint: string | null }> {
  const tech = await makeStaff(db(), "tech");
  const res = await searchRoute.GET(request(`/api/search?q=${encodeURIComponent(q)}`, { cookie: await sessionCookieFor(tech.id) }));
  expect(res.status).toBe(200);
  return readBody(res);
}
const kinds = (a: { groups: Group[] }) => Object.fromEntries(a.groups.map((g) => [g.kind, g.hits.map((h) => h.href)]));

describe("one search for everything", () => {
  it("finds jobs by their description, trucks by the last six of the VIN, and customers, contacts, parts, coaters and captions, grouped by kind", async () => {
    await ensureShop(db());
    const customer = await makeCustomer(db(), "Marsh Hollow Paving");
    const truck = await makeTruck(db(), customer.id);
    const job = await makeJob(db(), { customerId: customer.id, truckId: truck.id });
    await db().updateTable("job").set({ description: "Wet kit: 35 gal stainless reservoir" }).where("id", "=", job.id).execute();
    await db().insertInto("contact").values({ customer_id: customer.id, name: "Dana Quillfeather", email: "", phone: "", receives_email: 0 }).execute();
    await db().insertInto("part").values({ job_id: job.id, name: "Hydraulic tank, 35 gal", kind: "reservoir", material: "stainless", needs_leak_test: 1, needs_coating: 1, created_at: "2026-03-02T15:00:00.000Z", updated_at: "2026-03-02T15:00:00.000Z" } as never).execute();
    await db().insertInto("vendor").values({ name: "Ridgeline Powder", contact: "", phone: "", email: "", usual_turnaround_days: 4, notes: "", created_at: "2026-03-02T15:00:00.000Z" }).execute();
    const staff = await makeStaff(db(), "tech");
    await db().insertInto("photo").values({ job_id: job.id, stage: "fabricate", part_id: null, caption: "Baffle welds before the lid", customer_visible: 0, uploaded_by: staff.id, upload_key: "k-1", original_name: "a.jpg", original_type: "image/jpeg", original_bytes: 1, width: 1, height: 1, created_at: "2026-03-02T15:00:00.000Z", updated_at: "2026-03-02T15:00:00.000Z" }).execute();

    expect(kinds(await search("reservoir"))).toEqual({ job: [`/jobs/${job.id}`] });
    expect(kinds(await search("35 gal"))).toEqual({ job: [`/jobs/${job.id}`], part: [`/jobs/${job.id}`] });
    expect(kinds(await search(truck.vin.slice(-6)))).toEqual({ truck: [`/trucks/${truck.id}`] });
    expect(kinds(await search("hollow"))).toEqual({ customer: [`/customers/${customer.id}`] });
    expect(kinds(await search("quillf"))).toEqual({ contact: [`/customers/${customer.id}`] });
    expect(kinds(await search("RIDGELINE"))).toEqual({ vendor: ["/coating#vendors"] });
    expect(kinds(await search("baffle"))).toEqual({ photo: [`/jobs/${job.id}`] });
    expect((await search(job.work_order)).groups[0]).toMatchObject({ kind: "job", label: "Jobs", total: 1 });

    // Kept in step by the triggers: a changed description, a renamed coater, a deleted photo.
    await db().updateTable("job").set({ description: "Dump body hoist" }).where("id", "=", job.id).execute();
    expect(kinds(await search("reservoir"))).toEqual({});
    expect(kinds(await search("hoist"))).toEqual({ job: [`/jobs/${job.id}`] });
    await db().updateTable("vendor").set({ name: "Copperleaf Finishers" }).execute();
    expect(kinds(await search("ridgeline"))).toEqual({});
    await db().deleteFrom("photo").execute();
    expect(kinds(await search("baffle"))).toEqual({});
  });

  it("asks for three letters, and takes quotes and operators as plain text", async () => {
    expect(await search("ab")).toMatchObject({ groups: [], hint: "Type at least 3 letters or digits." });
    expect(await search("")).toMatchObject({ groups: [], hint: null });
    for (const q of ['say "hi"', "a OR b", "NEAR(x y)", "*", "col:val", "'; drop table job; --"]) {
      expect((await search(q)).groups, q).toEqual([]);
    }
  });
});
