import { describe, expect, it } from "vitest";
import * as jobItem from "@/app/api/jobs/[id]/route";
import * as jobs from "@/app/api/jobs/route";
import { useFreshDatabase } from "../support/db";
import { makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

describe("an impossible due date", () => {
  it("is refused on create and on edit with 400 naming the field, and nothing changes", async () => {
    const office = await makeStaff(db(), "office");
    const cookie = await sessionCookieFor(office.id);
    const customer = await makeCustomer(db());
    const truck = await makeTruck(db(), customer.id);
    const before = (await db().selectFrom("job").select("id").execute()).length;
    const created = await jobs.POST(request("/api/jobs", { cookie, body: { customerId: customer.id, truckId: truck.id, scope: "install_only", description: "Light bar", dueOn: "2026-02-31" } }));
    expect(created.status).toBe(400);
    expect(Object.keys((await readBody(created)).error.details.fields)).toEqual(["dueOn"]);
    expect((await db().selectFrom("job").select("id").execute()).length).toBe(before);

    const job = await makeJob(db());
    const edited = await jobItem.PATCH(request(`/api/jobs/${job.id}`, { method: "PATCH", cookie, body: { version: job.version, dueOn: "2026-02-31" } }), params({ id: String(job.id) }));
    expect(edited.status).toBe(400);
    expect((await db().selectFrom("job").select("due_on").where("id", "=", job.id).executeTakeFirstOrThrow()).due_on).toBeNull();
  });
});
