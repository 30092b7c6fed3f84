import { describe, expect, it } from "vitest";
import * as coatingRunItem from "@/app/api/coating-runs/[id]/route";
import * as coatingRuns from "@/app/api/coating-runs/route";
import * as jobItem from "@/app/api/jobs/[id]/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as parts from "@/app/api/jobs/[id]/parts/route";
import * as signOff from "@/app/api/jobs/[id]/sign-off/route";
import * as leakTests from "@/app/api/parts/[id]/leak-tests/route";
import * as partItem from "@/app/api/parts/[id]/route";
import * as shopSettings from "@/app/api/shop-settings/route";
import * as vendors from "@/app/api/vendors/route";
import type { Role } from "@/db/schema";
import { loadJobCost } from "@/server/labour/job-cost";
import { expectedEndPressurePsig } from "@/server/records/leak-test";
import { DEFAULT_ALLOWED_DROP_PSI } from "@/server/records/settings";
import { addBusinessDaysTo, shopToday } from "@/server/records/turnaround";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

const today = () => shopToday({ now: new Date(), timeZone: "US/Central" });
const fields = async (res: Response) => Object.keys((await readBody(res)).error.details.fields);

const tankBody = { name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", needsLeakTest: true, needsCoating: true };

async function addPart(cookie: string, jobId: number, body: Record<string, unknown> = tankBody) {
  const res = await parts.POST(request(`/api/jobs/${jobId}/parts`, { cookie, body }), params({ id: String(jobId) }));
  expect(res.status).toBe(201);
  return (await readBody(res)).part as { id: number; name: string; shape: string };
}

const goodTest = {
  method: "both", testPressurePsig: 4, gaugeFullScalePsi: 10, gaugeCalibratedOn: today(), holdMinutes: 20,
  startPressurePsig: 4, endPressurePsig: 4, startTempF: 70, endTempF: 70, seams: [{ location: "Sump to shell", result: "pass" }], tester: "Bench tech",
};

function postTest(cookie: string, partId: number | string, body: unknown) {
  return leakTests.POST(request(`/api/parts/${partId}/leak-tests`, { cookie, body }), params({ id: String(partId) }));
}

async function count(table: "part" | "leak_test" | "vendor" | "coating_run" | "coating_run_part" | "sign_off") {
  return Number((await db().selectFrom(table).select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n);
}

describe("parts", () => {
  it("a tech adds a reservoir with its geometry; the shape follows the geometry", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate", parts: false });
    const part = await addPart(tech.cookie, job.id, { ...tankBody, geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36.5 } });
    expect(part).toEqual(expect.objectContaining({ shape: "round", geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36.5 }, needsLeakTest: true, reworkCount: 0, coating: null }));
    const list = await readBody(await parts.GET(request(`/api/jobs/${job.id}/parts`, { cookie: tech.cookie }), params({ id: String(job.id) })));
    expect(list.parts.map((p: { id: number }) => p.id)).toEqual([part.id]);
  });

  it("refuses parts that do not hang together, naming the field, and adds nothing", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const before = await count("part");
    const cases: [Record<string, unknown>, string][] = [
      [{ ...tankBody, needsLeakTest: false }, "needsLeakTest"],
      [{ ...tankBody, kind: "bracket", geometry: { shape: "box", lengthIn: 30, widthIn: 12, heightIn: 14 } }, "geometry"],
      [{ ...tankBody, shape: "box", geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36 } }, "shape"],
      [{ ...tankBody, geometry: { shape: "round", insideDiameterIn: 0, lengthIn: 36 } }, "geometry.insideDiameterIn"],
      [{ ...tankBody, material: "brass" }, "material"],
      [{ ...tankBody, name: " " }, "name"],
    ];
    for (const [body, field] of cases) {
      const res = await parts.POST(request(`/api/jobs/${job.id}/parts`, { cookie: tech.cookie, body }), params({ id: String(job.id) }));
      expect(res.status, field).toBe(400);
      expect(await fields(res), field).toContain(field);
    }
    expect((await parts.POST(request("/api/jobs/99999/parts", { cookie: tech.cookie, body: tankBody }), params({ id: "99999" }))).status).toBe(404);
    expect((await parts.POST(request("/api/jobs/WO-7/parts", { cookie: tech.cookie, body: tankBody }), params({ id: "WO-7" }))).status).toBe(400);
    expect(await count("part")).toBe(before);
  });

  it("PATCH edits, refuses unknown keys and a reservoir without a test, and deletes only a part with no records", async () => {
    const tech = await as("tech");
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    const part = await addPart(tech.cookie, job.id);
    // The office: taking a part off the coating list and removing parts are theirs (see "who may change what a gate asks").
    const patch = (body: unknown) => partItem.PATCH(request(`/api/parts/${part.id}`, { method: "PATCH", cookie: office.cookie, body }), params({ id: String(part.id) }));
    const renamed = await patch({ name: "35 gal round reservoir", material: "stainless", needsCoating: false });
    expect(renamed.status).toBe(200);
    expect((await readBody(renamed)).part).toEqual(expect.objectContaining({ name: "35 gal round reservoir", material: "stainless", needsCoating: false }));
    expect(await fields(await patch({ needsLeakTest: false }))).toEqual(["needsLeakTest"]);
    expect((await patch({ job_id: 1 })).status).toBe(400);
    expect((await patch({ reworked: false })).status).toBe(400);
    expect((await partItem.PATCH(request("/api/parts/x1", { method: "PATCH", cookie: tech.cookie, body: { name: "x" } }), params({ id: "x1" }))).status).toBe(400);
    expect((await partItem.PATCH(request("/api/parts/99999", { method: "PATCH", cookie: tech.cookie, body: { name: "x" } }), params({ id: "99999" }))).status).toBe(404);

    expect((await postTest(tech.cookie, part.id, goodTest)).status).toBe(201);
    const del = (id: number) => partItem.DELETE(request(`/api/parts/${id}`, { method: "DELETE", cookie: office.cookie }), params({ id: String(id) }));
    expect((await del(part.id)).status).toBe(409);
    const mistake = await addPart(tech.cookie, job.id, { name: "Duplicate entry", kind: "bracket", material: "aluminum", needsLeakTest: false, needsCoating: false });
    expect((await del(mistake.id)).status).toBe(204);
    expect(await db().selectFrom("part").select("id").where("id", "=", mistake.id).executeTakeFirst()).toBeUndefined();
  });
});

describe("leak tests", () => {
  it("answers with the server's corrected drop, result and warnings: cooling alone passes, a wrong gauge is flagged", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id, { ...tankBody, geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36.5 } });
    // 80 → 60 °F at 4 psig: the gauge falls about 0.69 psi from cooling alone (ideal gas law).
    const cooled = expectedEndPressurePsig({ startPressurePsig: 4, startTempF: 80, endTempF: 60, barometricPsia: 14.696 });
    const res = await postTest(tech.cookie, tank.id, { ...goodTest, jobId: job.id, gaugeFullScalePsi: 30, startTempF: 80, endTempF: 60, endPressurePsig: Number(cooled.toFixed(4)), gaugeCalibratedOn: today() });
    expect(res.status).toBe(201);
    const body = await readBody(res);
    // The readings alone would pass, but a 30 psi gauge is outside 6–16 psi for 4 psig: invalid.
    expect(body.result).toBe("invalid");
    expect(body.correctedDropPsi).toBeLessThan(0.001);
    expect(body.warnings.map((w: { code: string }) => w.code)).toEqual(["gauge_range"]);
    expect(body.invalidReasons.map((w: { code: string }) => w.code)).toEqual(["gauge_range"]);
    expect(body.warnings[0].message).toMatch(/ASME BPVC Section V, Article 10/);
    expect(body.test).toEqual(expect.objectContaining({ partId: tank.id, current: true, allowedDropPsi: DEFAULT_ALLOWED_DROP_PSI, recordedByName: tech.staff.name, barometricPsia: 14.696 }));
    expect(body.test.rawDropPsi).toBeGreaterThan(0.6);
  });

  it("each method asks for what it decides on: decay is refused naming a missing reading; a soap-only box tank is recorded without decay readings", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test", parts: false });
    const box = await addPart(tech.cookie, job.id, { ...tankBody, name: "Box tank, right rail", geometry: { shape: "box", lengthIn: 30, widthIn: 12, heightIn: 14 } });
    const round = await addPart(tech.cookie, job.id, { ...tankBody, name: "Round tank" });
    const before = await count("leak_test");
    const { endPressurePsig: _end, ...noEnd } = goodTest;
    for (const method of ["decay", "both"]) {
      const refused = await postTest(tech.cookie, round.id, { ...noEnd, method, jobId: job.id });
      expect(refused.status).toBe(400);
      expect((await readBody(refused)).error.details.fields).toEqual({ endPressurePsig: ["Enter the end pressure in psig: pressure decay is read from the start and end of the hold."] });
    }
    expect(await count("leak_test")).toBe(before);

    // UL 142 §42.2.1: a rectangular tank is tested at 1.5–3 psig; soap on every seam, no bubbles.
    const { startPressurePsig: _s, startTempF: _st, endTempF: _et, ...soapOnly } = noEnd;
    const seams = [{ location: "Top seam", result: "pass" }, { location: "Sump", result: "pass" }];
    const res = await postTest(tech.cookie, box.id, { ...soapOnly, method: "soap", testPressurePsig: 2, gaugeFullScalePsi: 5, seams, jobId: job.id });
    expect(res.status).toBe(201);
    const body = await readBody(res);
    expect(body).toMatchObject({ result: "pass", correctedDropPsi: null, warnings: [], invalidReasons: [] });
    expect(body.test).toMatchObject({ method: "soap", testPressurePsig: 2, startPressurePsig: null, endPressurePsig: null, startTempF: null, endTempF: null, rawDropPsi: null, correctedDropPsi: null });
    // The gate into coating counts it as the part's passing test.
    const listed = await readBody(await leakTests.GET(request(`/api/parts/${box.id}/leak-tests`, { cookie: tech.cookie }), params({ id: String(box.id) })));
    expect(listed.leakTests.map((t: { result: string; correctedDropPsi: number | null }) => [t.result, t.correctedDropPsi])).toEqual([["pass", null]]);
  });

  it("a D-shaped reservoir is kept with its geometry and tested as flat-walled: the box tank's band, soap deciding", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test", parts: false });
    const geometry = { shape: "d", lengthIn: 40, widthIn: 14, heightIn: 20 };
    const tank = await addPart(tech.cookie, job.id, { ...tankBody, name: "D tank, left rail", geometry });
    expect(tank).toEqual(expect.objectContaining({ shape: "d", geometry }));
    const narrow = await parts.POST(request(`/api/jobs/${job.id}/parts`, { cookie: tech.cookie, body: { ...tankBody, geometry: { ...geometry, widthIn: 9 } } }), params({ id: String(job.id) }));
    expect(narrow.status).toBe(400);
    expect(await fields(narrow)).toEqual(["geometry.widthIn"]);

    // 4 psig suits a round tank; for flat walls it is over UL 142's rectangular 1.5–3 psig.
    const high = await readBody(await postTest(tech.cookie, tank.id, { ...goodTest, jobId: job.id }));
    expect(high.result).toBe("invalid");
    expect(high.invalidReasons.map((w: { code: string }) => w.code)).toEqual(["test_pressure_outside_band"]);
    expect(high.invalidReasons[0].message).toContain("1.5–3 psig for a D-shaped tank");

    const atTwo = { ...goodTest, jobId: job.id, testPressurePsig: 2, startPressurePsig: 2, endPressurePsig: 2, gaugeFullScalePsi: 5 };
    const both = await readBody(await postTest(tech.cookie, tank.id, atTwo));
    expect(both.result).toBe("pass");
    expect(both.warnings.map((w: { code: string }) => w.code)).toEqual(["decay_on_box_tank"]);
    expect(both.test.partShape).toBe("d");
    const decayOnly = await readBody(await postTest(tech.cookie, tank.id, { ...atTwo, method: "decay", seams: [] }));
    expect(decayOnly.result).toBe("invalid");
  });

  it("decides against the shop's allowance, which the owner sets and each test keeps", async () => {
    const owner = await as("owner");
    const office = await as("office");
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    const drop = { ...goodTest, endPressurePsig: 3.92 };
    expect((await readBody(await postTest(tech.cookie, tank.id, drop))).result).toBe("fail");

    const setAllowance = (cookie: string, body: unknown) => shopSettings.PATCH(request("/api/shop-settings", { method: "PATCH", cookie, body }));
    expect((await setAllowance(office.cookie, { leakAllowedDropPsi: 0.1 })).status).toBe(403);
    expect(await fields(await setAllowance(owner.cookie, { leakAllowedDropPsi: -0.01 }))).toEqual(["leakAllowedDropPsi"]);
    expect(await fields(await setAllowance(owner.cookie, { leakAllowedDropPsi: 5 }))).toEqual(["leakAllowedDropPsi"]);
    const set = await setAllowance(owner.cookie, { leakAllowedDropPsi: 0.1 });
    expect(set.status).toBe(200);
    expect((await readBody(set)).settings.leakAllowedDropPsi).toBe(0.1);

    const again = await readBody(await postTest(tech.cookie, tank.id, drop));
    expect(again.result).toBe("pass");
    expect(again.test.allowedDropPsi).toBe(0.1);
    const history = (await readBody(await leakTests.GET(request(`/api/parts/${tank.id}/leak-tests`, { cookie: tech.cookie }), params({ id: String(tank.id) })))).leakTests;
    expect(history.map((t: { result: string; allowedDropPsi: number }) => [t.result, t.allowedDropPsi])).toEqual([["pass", 0.1], ["fail", DEFAULT_ALLOWED_DROP_PSI]]);
    await setAllowance(owner.cookie, { leakAllowedDropPsi: DEFAULT_ALLOWED_DROP_PSI });
  });

  it("a failed test answers with the job as it stands now, so the move back to Fabricate goes through with that version and a note", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    // The bench opened the page at version 1; the office then edits the job, so the page's copy is stale.
    const edited = await jobItem.PATCH(request(`/api/jobs/${job.id}`, { method: "PATCH", cookie: office.cookie, body: { version: job.version, notes: "Customer asked for a second drain plug." } }), params({ id: String(job.id) }));
    expect(edited.status).toBe(200);

    const res = await postTest(tech.cookie, tank.id, { ...goodTest, jobId: job.id, seams: [{ location: "Fill neck", result: "leak" }] });
    expect(res.status).toBe(201);
    const answer = await readBody(res);
    expect(answer.result).toBe("fail");
    expect(answer.job).toEqual({ id: job.id, workOrder: job.work_order, stage: "pressure_test", scope: "fabrication", version: job.version + 1 });

    const move = (version: number) =>
      moves.POST(request(`/api/jobs/${job.id}/moves`, { cookie: tech.cookie, body: { toStage: "fabricate", version, note: "Leak test failed: 40 gal round reservoir, leak at Fill neck." } }), params({ id: String(job.id) }));
    const stale = await move(job.version);
    expect(stale.status).toBe(409);
    expect((await readBody(stale)).error.details.job).toEqual(expect.objectContaining({ stage: "pressure_test", version: answer.job.version }));
    expect((await move(answer.job.version)).status).toBe(200);
    const event = await db().selectFrom("stage_event").select(["from_stage", "to_stage", "note"]).where("job_id", "=", job.id).orderBy("id", "desc").executeTakeFirstOrThrow();
    expect(event).toEqual({ from_stage: "pressure_test", to_stage: "fabricate", note: "Leak test failed: 40 gal round reservoir, leak at Fill neck." });
  });

  it("flags a pressure that rose after the temperature correction, and keeps the flag with the test", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    // 70 → 67 °F with the gauge unchanged: cooling should have dropped it, so corrected it "rose".
    const res = await postTest(tech.cookie, tank.id, { ...goodTest, jobId: job.id, gaugeCalibratedOn: today(), startTempF: 70, endTempF: 67 });
    expect(res.status).toBe(201);
    const answer = await readBody(res);
    expect(answer.correctedDropPsi).toBeLessThan(-0.1);
    expect(answer.result).toBe("pass");
    expect(answer.warnings.map((w: { code: string }) => w.code)).toEqual(["pressure_rose_after_correction"]);
    expect(answer.test.warnings).toEqual(answer.warnings);
  });

  it("refuses bad input with the field named and records nothing", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const other = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    const before = await count("leak_test");
    const cases: [Record<string, unknown>, string][] = [
      [{ ...goodTest, startPressurePsig: -1 }, "startPressurePsig"],
      [{ ...goodTest, endPressurePsig: -0.5 }, "endPressurePsig"],
      [{ ...goodTest, endTempF: 294 }, "endTempF"],
      [{ ...goodTest, startTempF: -60 }, "startTempF"],
      [{ ...goodTest, method: "soap", seams: [] }, "seams"],
      [{ ...goodTest, seams: [{ location: "Fill neck", result: "maybe" }] }, "seams.0.result"],
      [{ ...goodTest, jobId: other.id }, "jobId"],
      [{ ...goodTest, jobId: "WO-1" }, "jobId"],
    ];
    for (const [body, field] of cases) {
      const res = await postTest(tech.cookie, tank.id, body);
      expect(res.status, field).toBe(400);
      expect(await fields(res), field).toContain(field);
    }
    expect((await postTest(tech.cookie, "1e3", goodTest)).status).toBe(400);
    expect((await postTest(tech.cookie, 99999, goodTest)).status).toBe(404);
    const notJson = await leakTests.POST(request(`/api/parts/${tank.id}/leak-tests`, { cookie: tech.cookie, rawBody: "method=both", headers: { "content-type": "text/plain" } }), params({ id: String(tank.id) }));
    expect(notJson.status).toBe(415);
    const crossSite = await leakTests.POST(request(`/api/parts/${tank.id}/leak-tests`, { cookie: tech.cookie, body: goodTest, headers: { origin: "https://elsewhere.example" } }), params({ id: String(tank.id) }));
    expect(crossSite.status).toBe(403);
    expect(await count("leak_test")).toBe(before);
  });
});

describe("vendors and coating runs", () => {
  async function setup() {
    const office = await as("office");
    const tech = await as("tech");
    const vendorRes = await vendors.POST(request("/api/vendors", { cookie: office.cookie, body: { name: `Coater ${Math.random().toString(36).slice(2, 7)}`, contact: "Front desk", phone: "(555) 010-0150", email: "desk@coater.example", usualTurnaroundDays: 5 } }));
    expect(vendorRes.status).toBe(201);
    const vendor = (await readBody(vendorRes)).vendor;
    const job = await makeJob(db(), { stage: "coating" });
    const tank = await addPart(tech.cookie, job.id);
    expect((await postTest(tech.cookie, tank.id, goodTest)).status).toBe(201);
    return { office, tech, vendor, job, tank };
  }
  const runBody = (vendorId: number, partIds: unknown[], over: Record<string, unknown> = {}) => ({
    vendorId, finish: { colour: "Gloss black", gloss: "gloss" }, sentOn: today(), promisedOn: addBusinessDaysTo(today(), 5), partIds, ...over,
  });
  const send = (cookie: string, body: unknown) => coatingRuns.POST(request("/api/coating-runs", { cookie, body }));
  const patchRun = (cookie: string, id: number | string, body: unknown) =>
    coatingRunItem.PATCH(request(`/api/coating-runs/${id}`, { method: "PATCH", cookie, body }), params({ id: String(id) }));

  it("the office keeps the vendors list; a tech may read it but not add to it; names are unique", async () => {
    const { office, tech, vendor } = await setup();
    expect((await vendors.POST(request("/api/vendors", { cookie: tech.cookie, body: { name: "Bench coat", usualTurnaroundDays: 3 } }))).status).toBe(403);
    const same = await vendors.POST(request("/api/vendors", { cookie: office.cookie, body: { name: vendor.name.toUpperCase(), usualTurnaroundDays: 3 } }));
    expect(await fields(same)).toEqual(["name"]);
    const bad = await vendors.POST(request("/api/vendors", { cookie: office.cookie, body: { name: "Another", email: "not-an-address", usualTurnaroundDays: 0 } }));
    expect((await fields(bad)).sort()).toEqual(["email", "usualTurnaroundDays"]);
    const list = (await readBody(await vendors.GET(request("/api/vendors", { cookie: tech.cookie })))).vendors;
    expect(list.find((v: { id: number }) => v.id === vendor.id)).toEqual(expect.objectContaining({ usualTurnaroundDays: 5, record: expect.objectContaining({ runs: 0 }) }));
  });

  it("only the office and owner send runs; bad runs get 400 naming the field and create nothing", async () => {
    const { office, tech, vendor, job, tank } = await setup();
    const untested = await addPart(tech.cookie, job.id, { ...tankBody, name: "Untested tank" });
    const bracket = await addPart(tech.cookie, job.id, { name: "Light bar bracket", kind: "bracket", material: "aluminum", needsLeakTest: false, needsCoating: false });
    expect((await send(tech.cookie, runBody(vendor.id, [tank.id]))).status).toBe(403);
    const runsBefore = await count("coating_run");
    const linksBefore = await count("coating_run_part");
    const cases: [unknown, string][] = [
      [runBody(vendor.id, [tank.id], { receivedOn: addBusinessDaysTo(today(), -3) }), "receivedOn"],
      [runBody(vendor.id, [tank.id], { promisedOn: addBusinessDaysTo(today(), -3) }), "promisedOn"],
      [runBody(vendor.id, [tank.id], { sentOn: addBusinessDaysTo(today(), 2), promisedOn: addBusinessDaysTo(today(), 6) }), "sentOn"],
      [runBody(99999, [tank.id]), "vendorId"],
      [runBody(vendor.id, [tank.id, untested.id]), "partIds.1"],
      [runBody(vendor.id, [bracket.id]), "partIds.0"],
      [runBody(vendor.id, [99999]), "partIds.0"],
      [runBody(vendor.id, ["12"]), "partIds.0"],
      [runBody(vendor.id, [tank.id], { finish: { colour: "Red", gloss: "shiny" } }), "finish.gloss"],
    ];
    for (const [body, field] of cases) {
      const res = await send(office.cookie, body);
      expect(res.status, field).toBe(400);
      expect(await fields(res), field).toContain(field);
    }
    const untestedMessage = (await readBody(await send(office.cookie, runBody(vendor.id, [untested.id])))).error.details.fields["partIds.0"][0];
    expect(untestedMessage).toMatch(/no passing leak test/);
    expect(await count("coating_run")).toBe(runsBefore);
    expect(await count("coating_run_part")).toBe(linksBefore);

    const ok = await send(office.cookie, runBody(vendor.id, [tank.id]));
    expect(ok.status).toBe(201);
    const again = await send(office.cookie, runBody(vendor.id, [tank.id]));
    expect((await readBody(again)).error.details.fields["partIds.0"][0]).toMatch(/already out on coating run/);
  });

  it("marking received: not before the sent date, not in the future; inspection needs the run received; roles", async () => {
    const { office, tech, vendor, tank } = await setup();
    const sentOn = addBusinessDaysTo(today(), -4);
    const run = (await readBody(await send(office.cookie, runBody(vendor.id, [tank.id], { sentOn, promisedOn: addBusinessDaysTo(today(), -1) })))).run;
    expect(run.overdue).toBe(true);
    expect(run.businessDaysOut).toBe(4);

    const stamp = await db().selectFrom("coating_run").selectAll().where("id", "=", run.id).executeTakeFirstOrThrow();
    const refusals: [unknown, string][] = [
      [{ receivedOn: addBusinessDaysTo(sentOn, -1) }, "receivedOn"],
      [{ receivedOn: addBusinessDaysTo(today(), 1) }, "receivedOn"],
      [{ inspection: { dftReadingsMils: [2.5], adhesionOk: true } }, "inspection"],
      [{ receivedOn: today(), inspection: { dftReadingsMils: [65], adhesionOk: true } }, "inspection.dftReadingsMils.0"],
      [{ promisedOn: addBusinessDaysTo(sentOn, -1) }, "promisedOn"],
      [{ receivedOn: null }, "receivedOn"],
    ];
    for (const [body, field] of refusals) {
      const res = await patchRun(office.cookie, run.id, body);
      expect(res.status, field).toBe(400);
      expect(await fields(res), field).toContain(field);
    }
    expect(await fields(await patchRun(office.cookie, run.id, { sentOn: today() }))).toEqual(["_"]);
    expect(await db().selectFrom("coating_run").selectAll().where("id", "=", run.id).executeTakeFirstOrThrow()).toEqual(stamp);

    expect((await patchRun(tech.cookie, run.id, { promisedOn: today() })).status).toBe(403);
    const moved = await patchRun(office.cookie, run.id, { promisedOn: addBusinessDaysTo(today(), 2) });
    expect((await readBody(moved)).run.overdue).toBe(false);

    // Whoever unloads the truck marks it received and reads the film gauge.
    const back = await patchRun(tech.cookie, run.id, { receivedOn: today(), inspection: { dftReadingsMils: [2.2, 2.6], adhesionOk: true, defects: "Light orange peel on one end" } });
    expect(back.status).toBe(200);
    const body = (await readBody(back)).run;
    expect(body).toEqual(expect.objectContaining({ receivedOn: today(), overdue: false, businessDaysOut: 4 }));
    expect(body.inspection).toEqual(expect.objectContaining({ dftReadingsMils: [2.2, 2.6], defects: "Light orange peel on one end", inspectedByName: tech.staff.name }));
    const open = (await readBody(await coatingRuns.GET(request("/api/coating-runs?status=open", { cookie: tech.cookie })))).runs;
    expect(open.map((r: { id: number }) => r.id)).not.toContain(run.id);

    expect((await patchRun(office.cookie, "abc", { receivedOn: today() })).status).toBe(400);
    expect((await patchRun(office.cookie, 99999, { receivedOn: today() })).status).toBe(404);
    expect((await coatingRuns.GET(request("/api/coating-runs?status=lost", { cookie: tech.cookie }))).status).toBe(400);
  });

  it("the office records the coater's price on sending or later; a tech neither sets nor sees it; each job's cost takes its parts' share", async () => {
    const { office, tech, vendor, job, tank } = await setup();
    const other = await makeJob(db(), { stage: "coating" });
    const otherTank = await addPart(tech.cookie, other.id, { ...tankBody, name: "Other tank" });
    expect((await postTest(tech.cookie, otherTank.id, goodTest)).status).toBe(201);
    const second = await addPart(tech.cookie, job.id, { name: "Battery box", kind: "box", material: "aluminum", needsLeakTest: false, needsCoating: true });

    const bad = await send(office.cookie, runBody(vendor.id, [tank.id], { priceCents: 12.5 }));
    expect(await fields(bad)).toEqual(["priceCents"]);
    // The price field is in dollars: a price typed with letters is refused in the field's words.
    const lettered = await send(office.cookie, runBody(vendor.id, [tank.id], { priceCents: "48.7five" }));
    expect((await readBody(lettered)).error.details.fields.priceCents).toEqual(["Type dollars and cents, such as 48.75."]);
    const sent = await send(office.cookie, runBody(vendor.id, [tank.id, second.id, otherTank.id], { priceCents: 30_001 }));
    expect(sent.status).toBe(201);
    const run = (await readBody(sent)).run;
    expect(run.priceCents).toBe(30_001);

    // $300.01 over three parts: 10001 + 10000 + 10000 cents; this job has two of them.
    expect(await loadJobCost(db(), job.id)).toEqual(expect.objectContaining({ coatingCents: 20_001, unpricedCoatingRuns: 0 }));
    expect(await loadJobCost(db(), other.id)).toEqual(expect.objectContaining({ coatingCents: 10_000, totalCents: 10_000 }));

    expect((await patchRun(tech.cookie, run.id, { priceCents: 1 })).status).toBe(403);
    const seen = (await readBody(await coatingRunItem.GET(request(`/api/coating-runs/${run.id}`, { cookie: tech.cookie }), params({ id: String(run.id) })))).run;
    expect(seen).not.toHaveProperty("priceCents");
    const listed = (await readBody(await coatingRuns.GET(request("/api/coating-runs?status=all", { cookie: tech.cookie })))).runs;
    expect(listed.every((r: object) => !("priceCents" in r))).toBe(true);
    const received = (await readBody(await patchRun(tech.cookie, run.id, { receivedOn: today() }))).run;
    expect(received).not.toHaveProperty("priceCents");

    // Cleared, the run counts as not priced.
    const cleared = await patchRun(office.cookie, run.id, { priceCents: null });
    expect((await readBody(cleared)).run.priceCents).toBeNull();
    expect(await loadJobCost(db(), job.id)).toEqual(expect.objectContaining({ coatingCents: 0, unpricedCoatingRuns: 1 }));
    expect(await fields(await patchRun(office.cookie, run.id, { priceCents: -1 }))).toEqual(["priceCents"]);
    expect((await patchRun(office.cookie, run.id, { priceCents: 48_000 })).status).toBe(200);
    expect(await loadJobCost(db(), job.id)).toEqual(expect.objectContaining({ coatingCents: 32_000 }));
  });

  it("a part out on a run cannot be unmarked for coating", async () => {
    const { office, tech, vendor, tank } = await setup();
    expect((await send(office.cookie, runBody(vendor.id, [tank.id]))).status).toBe(201);
    const res = await partItem.PATCH(request(`/api/parts/${tank.id}`, { method: "PATCH", cookie: office.cookie, body: { needsCoating: false } }), params({ id: String(tank.id) }));
    expect(await fields(res)).toEqual(["needsCoating"]);
    const part = (await readBody(await partItem.GET(request(`/api/parts/${tank.id}`, { cookie: tech.cookie }), params({ id: String(tank.id) })))).part;
    expect(part.needsCoating).toBe(true);
    expect(part.coating).toEqual(expect.objectContaining({ vendorName: vendor.name, state: "out" }));
  });
});

describe("the wiring & run-test sign-off", () => {
  it("saves a draft, resumes it, and refuses bad input naming the field", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "wire" });
    const put = (body: object, expectedVersion = 1) =>
      signOff.PUT(request(`/api/jobs/${job.id}/sign-off`, { method: "PUT", cookie: tech.cookie, body: { expectedVersion, ...body } }), params({ id: String(job.id) }));
    const get = () => signOff.GET(request(`/api/jobs/${job.id}/sign-off`, { cookie: tech.cookie }), params({ id: String(job.id) }));
    expect((await readBody(await get())).signOff).toBeNull();
    const saved = await readBody(await put({ indicatorSource: "switch", checks: { pump_no_cavitation: true }, reliefPressurePsi: 2400 }, 0));
    expect(saved.signOff).toEqual(expect.objectContaining({ complete: false, signedAt: null }));
    const resumed = (await readBody(await get())).signOff;
    expect(resumed.fields).toEqual(expect.objectContaining({ indicatorSource: "switch", checks: { pump_no_cavitation: true }, reliefPressurePsi: 2400 }));
    expect(resumed.missing[0]).toMatch(/indicator input/);

    const before = await db().selectFrom("sign_off").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow();
    const bad = await put({ indicatorSource: "lamp", reliefPressurePsi: 17_200, checks: { pump_no_cavitation: "yes" } });
    expect((await fields(bad)).sort()).toEqual(["checks.pump_no_cavitation", "indicatorSource", "reliefPressurePsi"]);
    expect(await db().selectFrom("sign_off").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow()).toEqual(before);
    expect((await signOff.PUT(request("/api/jobs/0/sign-off", { method: "PUT", cookie: tech.cookie, body: { expectedVersion: 0 } }), params({ id: "0" }))).status).toBe(400);
    expect((await signOff.PUT(request("/api/jobs/99999/sign-off", { method: "PUT", cookie: tech.cookie, body: { expectedVersion: 0 } }), params({ id: "99999" }))).status).toBe(404);
    expect(await count("sign_off")).toBeGreaterThan(0);
  });
});
