import { parse } from "csv-parse/sync";
import { beforeAll, describe, expect, it } from "vitest";
import * as coatingRunsCsv from "@/app/api/coating-runs/export.csv/route";
import * as coatingRuns from "@/app/api/coating-runs/route";
import * as jobsCsv from "@/app/api/jobs/export.csv/route";
import * as vendors from "@/app/api/vendors/route";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

/*
 * CSV injection (OWASP's "CSV Injection" page): a spreadsheet runs a cell that starts with
 * = + - @ tab or carriage return as a formula. The rule the exports follow: such a cell gets a
 * single quote in front, which spreadsheets show as text. The expected cells below are the typed
 * values with that quote added by hand.
 */
const { db } = useFreshDatabase();
let office = "";
let tech = "";
const ids: Record<string, number> = {};

const csvRows = (text: string) => parse(text, { columns: true, skip_empty_lines: true, relax_column_count: false }) as Record<string, string>[];

async function getCsv(route: { GET: (req: Request) => Promise<Response> }, path: string, cookie = office) {
  const res = await route.GET(request(path, { cookie }));
  return { res, text: res.status === 200 ? await res.text() : "" };
}

beforeAll(async () => {
  await ensureShop(db());
  office = await sessionCookieFor((await makeStaff(db(), "office")).id);
  tech = await sessionCookieFor((await makeStaff(db(), "tech")).id);
  const hostile = await makeCustomer(db(), '=HYPERLINK("x")');
  const plain = await makeCustomer(db(), "Plain Haulage");
  ids.hostile = (await makeJob(db(), { customerId: hostile.id, stage: "fabricate" })).id;
  ids.plain = (await makeJob(db(), { customerId: plain.id, stage: "install" })).id;
  await db().updateTable("job").set({ description: "+1 reservoir, -2 brackets", due_on: "2026-04-30" }).where("id", "=", ids.hostile).execute();
  await db().updateTable("job").set({ description: "@once\tthen a tab" }).where("id", "=", ids.plain).execute();
  for (const [n, text] of [["tab", "\tleading tab"], ["cr", "\rleading return"], ["minus", "-40 gal tank"]] as const) {
    const c = await makeCustomer(db(), `Customer ${n}`);
    ids[n] = (await makeJob(db(), { customerId: c.id, stage: "queued" })).id;
    await db().updateTable("job").set({ description: text }).where("id", "=", ids[n]).execute();
  }
});

describe("GET /api/jobs/export.csv", () => {
  it("has a header row, parses back with a CSV reader, and neutralises every cell a spreadsheet would run", async () => {
    const { res, text } = await getCsv(jobsCsv, "/api/jobs/export.csv");
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/csv");
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="jobs-\d{4}-\d{2}-\d{2}\.csv"/);
    expect(text.split("\r\n")[0]).toBe("work_order,customer,unit_number,vin,work,work_description,stage,priority,assigned_to,due_on,delivered_on,opened_at_utc,updated_at_utc");
    const rows = csvRows(text);
    expect(rows).toHaveLength(5);
    const workOrders = new Map((await db().selectFrom("job").select(["id", "work_order"]).execute()).map((j) => [j.id, j.work_order]));
    const byId = (id: number) => rows.find((r) => r.work_order === workOrders.get(id))!;
    const hostile = byId(ids.hostile);
    expect(hostile.customer).toBe(`'=HYPERLINK("x")`);
    expect(hostile.work_description).toBe("'+1 reservoir, -2 brackets");
    expect(hostile.stage).toBe("Fabricate");
    expect(hostile.due_on).toBe("2026-04-30");
    expect(hostile.opened_at_utc).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect(byId(ids.plain).customer).toBe("Plain Haulage");
    expect(byId(ids.plain).work_description).toBe("'@once\tthen a tab");
    expect(byId(ids.tab).work_description).toBe("'\tleading tab");
    expect(byId(ids.cr).work_description).toBe("'\rleading return");
    expect(byId(ids.minus).work_description).toBe("'-40 gal tank");
    // No cell of the file starts with a character a spreadsheet would run.
    for (const row of rows) for (const cell of Object.values(row)) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
  });

  it("takes the Jobs list's filters", async () => {
    const fabricate = csvRows((await getCsv(jobsCsv, "/api/jobs/export.csv?stage=fabricate")).text);
    expect(fabricate.map((r) => r.stage)).toEqual(["Fabricate"]);
    const late = csvRows((await getCsv(jobsCsv, "/api/jobs/export.csv?due=late")).text);
    expect(late.map((r) => r.customer)).toEqual([`'=HYPERLINK("x")`]);
    const searched = csvRows((await getCsv(jobsCsv, "/api/jobs/export.csv?q=leading")).text);
    expect(searched).toHaveLength(2);
  });

  it("refuses a filter it cannot read, naming it, and refuses a tech", async () => {
    const bad = await jobsCsv.GET(request("/api/jobs/export.csv?stage=paint", { cookie: office }));
    expect(bad.status).toBe(400);
    expect((await readBody(bad)).error.message).toContain("Unknown stage");
    expect((await jobsCsv.GET(request("/api/jobs/export.csv", { cookie: tech }))).status).toBe(403);
  });
});

describe("GET /api/coating-runs/export.csv", () => {
  it("lists each run with ISO dates, its jobs and parts, neutralised", async () => {
    const vendor = await readBody(
      await vendors.POST(request("/api/vendors", { cookie: office, body: { name: "@Ridge Powder", contact: "", phone: "", email: "", usualTurnaroundDays: 5, notes: "" } })),
    );
    const part = await db()
      .insertInto("part")
      .values({ job_id: ids.hostile, name: "=SUM(A1) bracket", kind: "bracket", material: "carbon_steel", needs_leak_test: 0, needs_coating: 1, created_at: new Date().toISOString(), updated_at: new Date().toISOString() } as never)
      .returning("id")
      .executeTakeFirstOrThrow();
    const sent = await coatingRuns.POST(
      request("/api/coating-runs", { cookie: office, body: { vendorId: vendor.vendor.id, finish: { colour: "-Black", gloss: "satin" }, sentOn: "2026-01-05", promisedOn: "2026-01-12", partIds: [part.id] } }),
    );
    expect(sent.status).toBe(201);
    const { res, text } = await getCsv(coatingRunsCsv, "/api/coating-runs/export.csv");
    expect(res.status).toBe(200);
    expect(text.split("\r\n")[0]).toMatch(/^run,coater,color,gloss,sent_on,promised_on,received_on,state,/);
    const [row, ...rest] = csvRows(text);
    expect(rest).toHaveLength(0);
    const wo = (await db().selectFrom("job").select("work_order").where("id", "=", ids.hostile).executeTakeFirstOrThrow()).work_order;
    expect(row).toEqual(
      expect.objectContaining({ coater: "'@Ridge Powder", color: "'-Black", gloss: "Satin", sent_on: "2026-01-05", promised_on: "2026-01-12", received_on: "", state: "overdue", jobs: wo }),
    );
    expect(row.parts).toBe(`${wo} =SUM(A1) bracket (=HYPERLINK("x"), unit ${(await db().selectFrom("truck").innerJoin("job", "job.truck_id", "truck.id").select("unit_number").where("job.id", "=", ids.hostile).executeTakeFirstOrThrow()).unit_number})`);
    expect((await coatingRunsCsv.GET(request("/api/coating-runs/export.csv?status=soon", { cookie: office }))).status).toBe(400);
    expect((await coatingRunsCsv.GET(request("/api/coating-runs/export.csv", { cookie: tech }))).status).toBe(403);
  });
});
