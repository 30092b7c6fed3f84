import { describe, expect, it } from "vitest";
import * as kitSpec from "@/app/api/jobs/[id]/kit-spec/route";
import type { Role } from "@/db/schema";
import { computeKitSpec, demoKitCalcInput, type KitCalcInput } from "@/server/kit-calc";
import { kitSpecHistory, kitSpecStartingInputs, latestKitSpec, latestKitSpecTank } from "@/server/kit-spec/queries";
import { useFreshDatabase } from "../support/db";
import { makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

function put(cookie: string, jobId: number | string, body: unknown) {
  return kitSpec.PUT(request(`/api/jobs/${jobId}/kit-spec`, { method: "PUT", cookie, body }), params({ id: String(jobId) }));
}

function get(cookie: string, jobId: number | string) {
  return kitSpec.GET(request(`/api/jobs/${jobId}/kit-spec`, { cookie }), params({ id: String(jobId) }));
}

async function rowsFor(jobId: number) {
  return db().selectFrom("kit_spec").select(["version", "saved_by"]).where("job_id", "=", jobId).orderBy("version").execute();
}

const boxKit: KitCalcInput = { ...demoKitCalcInput, tank: { shape: "box", lengthIn: 36, widthIn: 20, heightIn: 18 }, fillDepthIn: 15 };

describe("a job's kit spec", () => {
  it("starts empty: any staff member reads { spec: null }", async () => {
    const job = await makeJob(db());
    for (const role of ["tech", "office", "owner"] as const) {
      const res = await get((await as(role)).cookie, job.id);
      expect(res.status).toBe(200);
      expect(await readBody(res)).toEqual({ spec: null });
    }
  });

  it("the office saves version 1; the server computes the results and ignores any the client sends", async () => {
    const { staff, cookie } = await as("office");
    const job = await makeJob(db());
    expect(await rowsFor(job.id)).toEqual([]);
    const forged = { flowGpm: 9999, warnings: [] };
    const res = await put(cookie, job.id, { inputs: demoKitCalcInput, results: forged });
    expect(res.status).toBe(200);
    const { spec } = await readBody(res);
    expect(spec.version).toBe(1);
    expect(spec.inputs).toEqual(demoKitCalcInput);
    expect(spec.results).toEqual(JSON.parse(JSON.stringify(computeKitSpec(demoKitCalcInput))));
    expect(spec.results.flowGpm).not.toBe(forged.flowGpm);
    const stored = await db().selectFrom("kit_spec").select("results").where("job_id", "=", job.id).executeTakeFirstOrThrow();
    expect(JSON.parse(stored.results).flowGpm).toBeCloseTo((1200 * 1.15 * 3.5 * 0.9) / 231, 10);
    expect(spec.savedBy).toEqual({ id: staff.id, name: staff.name });
    expect(Date.parse(spec.savedAt)).not.toBeNaN();
    expect(await rowsFor(job.id)).toEqual([{ version: 1, saved_by: staff.id }]);
  });

  it("each save is a new version and the history is kept; GET answers the latest to a tech", async () => {
    const office = await as("office");
    const owner = await as("owner");
    const job = await makeJob(db());
    expect((await put(office.cookie, job.id, { inputs: demoKitCalcInput })).status).toBe(200);
    const second = await put(owner.cookie, job.id, { inputs: { ...demoKitCalcInput, pumpDisplacementCuIn: 4.5 }, expectedVersion: 1 });
    expect(second.status).toBe(200);
    expect((await readBody(second)).spec.version).toBe(2);
    const third = await put(office.cookie, job.id, { inputs: boxKit });
    expect((await readBody(third)).spec.version).toBe(3);
    expect((await rowsFor(job.id)).map((r) => [r.version, r.saved_by])).toEqual([
      [1, office.staff.id],
      [2, owner.staff.id],
      [3, office.staff.id],
    ]);
    expect((await kitSpecHistory(db(), job.id)).map((h) => h.version)).toEqual([3, 2, 1]);

    const tech = await as("tech");
    const res = await get(tech.cookie, job.id);
    expect(res.status).toBe(200);
    const { spec } = await readBody(res);
    expect(spec.version).toBe(3);
    expect(spec.inputs.tank).toEqual(boxKit.tank);
    expect(spec.results.tank.oilGal).toBeCloseTo((36 * 20 * 15) / 231 + demoKitCalcInput.sumpGal, 10);
  });

  it("versions count per job: another job's spec starts at 1", async () => {
    const { cookie } = await as("office");
    const a = await makeJob(db());
    const b = await makeJob(db());
    await put(cookie, a.id, { inputs: demoKitCalcInput });
    await put(cookie, a.id, { inputs: demoKitCalcInput });
    const first = await put(cookie, b.id, { inputs: demoKitCalcInput });
    expect((await readBody(first)).spec.version).toBe(1);
  });

  it("a stale expectedVersion answers 409 with the spec in force and stores nothing", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db());
    await put(cookie, job.id, { inputs: demoKitCalcInput, expectedVersion: 0 });
    await put(cookie, job.id, { inputs: boxKit, expectedVersion: 1 });
    const stale = await put(cookie, job.id, { inputs: { ...demoKitCalcInput, engineRpm: 1500 }, expectedVersion: 1 });
    expect(stale.status).toBe(409);
    const body = await readBody(stale);
    expect(body.error.code).toBe("stale");
    expect(body.error.message).toMatch(/version 2/);
    expect(body.error.details.spec.version).toBe(2);
    expect(body.error.details.spec.inputs.tank).toEqual(boxKit.tank);
    // expecting "no spec yet" when one exists is stale too
    expect((await put(cookie, job.id, { inputs: demoKitCalcInput, expectedVersion: 0 })).status).toBe(409);
    expect((await rowsFor(job.id)).length).toBe(2);
  });

  it("expecting a version on a job with no spec answers 409 with spec null", async () => {
    const { cookie } = await as("owner");
    const job = await makeJob(db());
    const res = await put(cookie, job.id, { inputs: demoKitCalcInput, expectedVersion: 4 });
    expect(res.status).toBe(409);
    expect((await readBody(res)).error.details.spec).toBeNull();
    expect(await rowsFor(job.id)).toEqual([]);
  });

  it("a tech may read but not save (403), and nothing is stored", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    const res = await put(cookie, job.id, { inputs: demoKitCalcInput });
    expect(res.status).toBe(403);
    expect((await readBody(res)).error.code).toBe("forbidden");
    expect(await rowsFor(job.id)).toEqual([]);
  });

  it("bad inputs answer 400 naming the field under inputs, and store nothing", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db());
    const cases: [unknown, string][] = [
      [{ inputs: { ...demoKitCalcInput, engineRpm: 0 } }, "inputs.engineRpm"],
      [{ inputs: { ...demoKitCalcInput, fillDepthIn: 25 } }, "inputs.fillDepthIn"],
      [{ inputs: { ...demoKitCalcInput, volumetricEfficiency: 1.1 } }, "inputs.volumetricEfficiency"],
      [{ inputs: { ...demoKitCalcInput, suctionLine: { insideDiameterIn: "big", lengthFt: 4 } } }, "inputs.suctionLine.insideDiameterIn"],
      [{ inputs: demoKitCalcInput, expectedVersion: 1.5 }, "expectedVersion"],
      [{ inputs: demoKitCalcInput, expectedVersion: -1 }, "expectedVersion"],
      [{}, "inputs"],
    ];
    for (const [body, field] of cases) {
      const res = await put(cookie, job.id, body);
      expect(res.status, field).toBe(400);
      expect(Object.keys((await readBody(res)).error.details.fields), field).toContain(field);
    }
    const raw = JSON.stringify({ inputs: demoKitCalcInput }).replace('"workingPressurePsi":2500', '"workingPressurePsi":NaN').replace('"engineRpm":1200', '"engineRpm":1e400');
    const nan = await kitSpec.PUT(
      request(`/api/jobs/${job.id}/kit-spec`, { method: "PUT", cookie, rawBody: raw, headers: { "content-type": "application/json", origin: "http://localhost:3000" } }),
      params({ id: String(job.id) }),
    );
    expect(nan.status).toBe(400);
    expect(Object.keys((await readBody(nan)).error.details.fields).sort()).toEqual(["inputs.engineRpm", "inputs.workingPressurePsi"]);
    expect(await rowsFor(job.id)).toEqual([]);
  });

  it("a job id of another shape answers 400; an unknown job 404", async () => {
    const office = await as("office");
    const tech = await as("tech");
    for (const id of ["abc", "0", "-3", "1.5", "12345678901"]) {
      expect((await get(tech.cookie, id)).status, id).toBe(400);
      expect((await put(office.cookie, id, { inputs: demoKitCalcInput })).status, id).toBe(400);
    }
    expect((await get(tech.cookie, 999_999)).status).toBe(404);
    const missing = await put(office.cookie, 999_999, { inputs: demoKitCalcInput });
    expect(missing.status).toBe(404);
    expect((await readBody(missing)).error.code).toBe("not_found");
  });

  it("latestKitSpecTank gives a reservoir part the tank of the spec in force", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db());
    expect(await latestKitSpecTank(db(), job.id)).toBeNull();
    await put(cookie, job.id, { inputs: demoKitCalcInput });
    await put(cookie, job.id, { inputs: boxKit });
    expect(await latestKitSpecTank(db(), job.id)).toEqual({ specVersion: 2, tank: boxKit.tank, fillDepthIn: 15, sumpGal: demoKitCalcInput.sumpGal });
    expect((await latestKitSpec(db(), job.id))?.version).toBe(2);
  });

  it("the editor starts from the latest spec, else from the truck's work engine speed", async () => {
    const { cookie } = await as("office");
    const customer = await makeCustomer(db());
    const truck = await makeTruck(db(), customer.id);
    await db().updateTable("truck").set({ work_engine_rpm: 1350 }).where("id", "=", truck.id).execute();
    const job = await makeJob(db(), { customerId: customer.id, truckId: truck.id });
    const start = await kitSpecStartingInputs(db(), job.id);
    expect(start?.from).toBe("truck");
    expect(start?.inputs.engineRpm).toBe(1350);
    await db().updateTable("truck").set({ work_engine_rpm: null }).where("id", "=", truck.id).execute();
    expect((await kitSpecStartingInputs(db(), job.id))?.inputs.engineRpm).toBe(demoKitCalcInput.engineRpm);
    await put(cookie, job.id, { inputs: boxKit });
    expect(await kitSpecStartingInputs(db(), job.id)).toEqual({ inputs: boxKit, from: "spec" });
    expect(await kitSpecStartingInputs(db(), 999_999)).toBeNull();
  });
});
