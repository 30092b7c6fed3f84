import { describe, expect, it, beforeAll } from "vitest";
import * as board from "@/app/api/board/route";
import * as receipts from "@/app/api/bought-parts/[id]/receipts/route";
import * as boughtItem from "@/app/api/bought-parts/[id]/route";
import * as fromQuoteRoute from "@/app/api/jobs/[id]/bought-parts/from-quote/route";
import * as boughtParts from "@/app/api/jobs/[id]/bought-parts/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as purchaseOrderItem from "@/app/api/purchase-orders/[id]/route";
import * as partsDesk from "@/app/api/parts-desk/route";
import * as purchaseOrders from "@/app/api/purchase-orders/route";
import * as labourRate from "@/app/api/shop-settings/labour-rate/route";
import type { Role, Stage } from "@/db/schema";
import { shopToday } from "@/server/records/turnaround";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));

async function as(role: Role) {
  await ensureShop(db());
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

async function addBought(cookie: string, jobId: number, body: Record<string, unknown>) {
  return boughtParts.POST(request(`/api/jobs/${jobId}/bought-parts`, { cookie, body }), params({ id: String(jobId) }));
}

async function receive(cookie: string, id: number, quantity: unknown) {
  return receipts.POST(request(`/api/bought-parts/${id}/receipts`, { cookie, body: { quantity } }), params({ id: String(id) }));
}

async function moveTo(cookie: string, jobId: number, toStage: Stage, override?: string) {
  const { version } = await db().selectFrom("job").select("version").where("id", "=", jobId).executeTakeFirstOrThrow();
  return moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body: { toStage, version, ...(override ? { override: { reason: override } } : {}) } }), params({ id: String(jobId) }));
}

const stageOf = async (jobId: number) => (await db().selectFrom("job").select("stage").where("id", "=", jobId).executeTakeFirstOrThrow()).stage;
const today = () => shopToday({ now: new Date(), timeZone: "US/Central" });

describe("bought-in parts on a job", () => {
  it("any staff member lists a part and gets 201 with its id and state", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const res = await addBought(tech.cookie, job.id, { kind: "pto", description: "10-bolt PTO, air shift", quantity: 1, supplier: "Test Drive Supply" });
    expect(res.status).toBe(201);
    const { part } = await readBody(res);
    expect(part).toEqual(expect.objectContaining({ id: expect.any(Number), state: "needed" }));
  });

  it("a tech cannot set or change a cost; the office can", async () => {
    const tech = await as("tech");
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    const refused = await addBought(tech.cookie, job.id, { kind: "pump", description: "Gear pump", quantity: 1, costCents: 64_900 });
    expect(refused.status).toBe(403);
    expect(await db().selectFrom("bought_part").select("id").where("job_id", "=", job.id).execute()).toEqual([]);

    const made = (await readBody(await addBought(tech.cookie, job.id, { kind: "pump", description: "Gear pump", quantity: 1 }))).part;
    const patch = (cookie: string, body: unknown) => boughtItem.PATCH(request(`/api/bought-parts/${made.id}`, { method: "PATCH", cookie, body }), params({ id: String(made.id) }));
    expect((await patch(tech.cookie, { costCents: 1 })).status).toBe(403);
    const ok = await patch(office.cookie, { costCents: 64_900 });
    expect(ok.status).toBe(200);
    expect((await readBody(ok)).part.costCents).toBe(64_900);
    // A tech reads the line without its cost.
    const asTech = await boughtItem.GET(request(`/api/bought-parts/${made.id}`, { cookie: tech.cookie }), params({ id: String(made.id) }));
    expect((await readBody(asTech)).part.costCents).toBeNull();
  });

  it("bad input answers 400 naming the field, and changes nothing", async () => {
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    for (const [body, field] of [
      [{ kind: "gearbox", description: "x", quantity: 1 }, "kind"],
      [{ kind: "pto", description: "", quantity: 1 }, "description"],
      [{ kind: "pto", description: "PTO", quantity: 0 }, "quantity"],
      [{ kind: "pto", description: "PTO", quantity: 1.5 }, "quantity"],
      [{ kind: "pto", description: "PTO", quantity: 1, costCents: 12.5 }, "costCents"],
      [{ kind: "pto", description: "PTO", quantity: 1, costCents: -1 }, "costCents"],
    ] as const) {
      const res = await addBought(office.cookie, job.id, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys((await readBody(res)).error.details.fields)).toContain(field);
    }
    expect(await db().selectFrom("bought_part").select("id").where("job_id", "=", job.id).execute()).toEqual([]);
  });

  it("a cost typed with letters in the dollars field is refused in dollars and cents, the words the form's label uses", async () => {
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    // The form sends what it cannot read as dollars as the text typed ("48.7five").
    for (const costCents of ["48.7five", 4875.5]) {
      const res = await addBought(office.cookie, job.id, { kind: "pto", description: "PTO", quantity: 1, costCents });
      expect(res.status).toBe(400);
      const [message] = (await readBody(res)).error.details.fields.costCents;
      expect(message).toBe("Type dollars and cents, such as 48.75.");
    }
    const rate = await labourRate.PATCH(request("/api/shop-settings/labour-rate", { method: "PATCH", cookie: (await as("owner")).cookie, body: { labourRateCents: "95.oo" } }));
    expect(rate.status).toBe(400);
    expect((await readBody(rate)).error.details.fields.labourRateCents).toEqual(["Type dollars and cents, such as 48.75."]);
    expect(await db().selectFrom("bought_part").select("id").where("job_id", "=", job.id).execute()).toEqual([]);
  });

  it("a receipt of more than is outstanding answers 400 naming quantity; a short receipt keeps the rest on order", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const part = (await readBody(await addBought(tech.cookie, job.id, { kind: "hose", description: "Pressure hose 3/4 in", quantity: 3 }))).part;
    const tooMany = await receive(tech.cookie, part.id, 4);
    expect(tooMany.status).toBe(400);
    expect((await readBody(tooMany)).error.details.fields.quantity[0]).toMatch(/Only 3 are still outstanding/);
    const short = await receive(tech.cookie, part.id, 2);
    expect(short.status).toBe(201);
    expect((await readBody(short)).part).toEqual(expect.objectContaining({ state: "ordered", receivedQuantity: 2 }));
    expect((await receive(tech.cookie, part.id, 2)).status).toBe(400);
    const rest = await readBody(await receive(tech.cookie, part.id, 1));
    expect(rest.part).toEqual(expect.objectContaining({ state: "received", receivedQuantity: 3 }));
    expect(rest.part.receipts.map((r: { quantity: number }) => r.quantity)).toEqual([2, 1]);
  });
});

describe("into Install: every bought-in part received", () => {
  it("refuses with 'waiting on …' naming each part by its description, then passes once they are received", async () => {
    const office = await as("office");
    const job = await makeJob(db(), { stage: "coating" });
    const pto = (await readBody(await addBought(office.cookie, job.id, { kind: "pto", description: "10-bolt PTO, air shift", quantity: 1, supplier: "Test Drive Supply" }))).part;
    const pump = (await readBody(await addBought(office.cookie, job.id, { kind: "pump", description: "Gear pump 3.2 cu in", quantity: 1, supplier: "Test Drive Supply" }))).part;

    const refused = await moveTo(office.cookie, job.id, "install");
    expect(refused.status).toBe(422);
    const unmet: string[] = (await readBody(refused)).error.details.unmet;
    expect(unmet).toEqual([
      "Into Install: waiting on 10-bolt PTO, air shift: not ordered yet; order it from the parts desk.",
      "Into Install: waiting on Gear pump 3.2 cu in: not ordered yet; order it from the parts desk.",
    ]);
    expect(await stageOf(job.id)).toBe("coating");

    // The board's card says which parts it waits on.
    const cardOf = async () => ((await readBody(await board.GET(request("/api/board", { cookie: office.cookie })))).cards as { id: number; waitingParts: string[] }[]).find((c) => c.id === job.id)!;
    expect((await cardOf()).waitingParts).toEqual(["10-bolt PTO, air shift", "Gear pump 3.2 cu in"]);

    expect((await receive(office.cookie, pto.id, 1)).status).toBe(201);
    const stillPump = await readBody(await moveTo(office.cookie, job.id, "install"));
    expect(stillPump.error.details.unmet).toEqual(["Into Install: waiting on Gear pump 3.2 cu in: not ordered yet; order it from the parts desk."]);

    expect((await receive(office.cookie, pump.id, 1)).status).toBe(201);
    expect((await cardOf()).waitingParts).toEqual([]);
    const moved = await moveTo(office.cookie, job.id, "install");
    expect(moved.status).toBe(200);
    expect(await stageOf(job.id)).toBe("install");
  });

  it("an install-only job waits for its bought-in parts too, and the owner may override with a reason, kept in the audit trail", async () => {
    const owner = await as("owner");
    const job = await makeJob(db(), { stage: "queued", scope: "install_only" });
    await addBought(owner.cookie, job.id, { kind: "valve", description: "Relief valve 2,500 psi", quantity: 1 });
    expect((await moveTo(owner.cookie, job.id, "install")).status).toBe(422);
    const over = await moveTo(owner.cookie, job.id, "install", "Valve comes with the customer's trailer tomorrow");
    expect(over.status).toBe(200);
    const audit = await db().selectFrom("audit_event").select(["kind", "summary"]).where("kind", "=", "override").execute();
    expect(audit.some((a) => a.summary.includes("waiting on Relief valve 2,500 psi"))).toBe(true);
  });
});

describe("purchase orders", () => {
  it("orders two jobs' lines from one supplier as one PO with a number and a total in cents; a receipt against it clears the wait", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const jobA = await makeJob(db(), { stage: "coating" });
    const jobB = await makeJob(db(), { stage: "fabricate" });
    const a = (await readBody(await addBought(office.cookie, jobA.id, { kind: "pto", description: "PTO for A", quantity: 1, costCents: 118_500, supplier: "Test Drive Supply" }))).part;
    const b = (await readBody(await addBought(office.cookie, jobB.id, { kind: "hose", description: "Hose for B", quantity: 2, costCents: 9_475 }))).part;
    const c = (await readBody(await addBought(office.cookie, jobB.id, { kind: "valve", description: "Valve elsewhere", quantity: 1, supplier: "Another Supplier" }))).part;

    const body = { supplier: "Test Drive Supply", partIds: [a.id, b.id], orderedOn: today(), expectedOn: null };
    expect((await purchaseOrders.POST(request("/api/purchase-orders", { cookie: tech.cookie, body }))).status).toBe(403);
    const wrongSupplier = await purchaseOrders.POST(request("/api/purchase-orders", { cookie: office.cookie, body: { ...body, partIds: [a.id, c.id] } }));
    expect(wrongSupplier.status).toBe(400);
    expect((await readBody(wrongSupplier)).error.details.fields.partIds[0]).toMatch(/Valve elsewhere .* is listed with Another Supplier/);
    expect(await db().selectFrom("purchase_order").select("id").execute()).toEqual([]);

    const res = await purchaseOrders.POST(request("/api/purchase-orders", { cookie: office.cookie, body }));
    expect(res.status).toBe(201);
    const po = (await readBody(res)).purchaseOrder;
    expect(po.number).toMatch(/^PO-\d{2}-0001$/);
    // $1,185.00 + 2 × $94.75 = $1,374.50
    expect(po.totalCents).toBe(137_450);
    expect(po.lines.map((l: { state: string; supplier: string }) => [l.state, l.supplier])).toEqual([["ordered", "Test Drive Supply"], ["ordered", "Test Drive Supply"]]);
    // Lines already on an order cannot go on another.
    const twice = await purchaseOrders.POST(request("/api/purchase-orders", { cookie: office.cookie, body }));
    expect(twice.status).toBe(400);

    const when = await purchaseOrderItem.PATCH(request(`/api/purchase-orders/${po.id}`, { method: "PATCH", cookie: office.cookie, body: { expectedOn: "1999-01-01" } }), params({ id: String(po.id) }));
    expect(when.status).toBe(400);

    const unmet = (await readBody(await moveTo(office.cookie, jobA.id, "install"))).error.details.unmet as string[];
    expect(unmet).toEqual([expect.stringMatching(new RegExp(`^Into Install: waiting on PTO for A: on order on ${po.number}`))]);
    expect((await receive(tech.cookie, a.id, 1)).status).toBe(201);
    expect((await moveTo(office.cookie, jobA.id, "install")).status).toBe(200);
  });

  it("removing a line is the office's, only while nothing of it is received, and leaves an audit line", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const part = (await readBody(await addBought(office.cookie, job.id, { kind: "fitting", description: "Bulkhead fitting", quantity: 4 }))).part;
    const del = (cookie: string) => boughtItem.DELETE(request(`/api/bought-parts/${part.id}`, { method: "DELETE", cookie }), params({ id: String(part.id) }));
    expect((await del(tech.cookie)).status).toBe(403);
    await receive(tech.cookie, part.id, 1);
    expect((await del(office.cookie)).status).toBe(409);
    await db().deleteFrom("bought_part_receipt").execute();
    await db().updateTable("bought_part").set({ received_quantity: 0, state: "needed" }).where("id", "=", part.id).execute();
    expect((await del(office.cookie)).status).toBe(204);
    const audit = await db().selectFrom("audit_event").select("summary").where("kind", "=", "bought_part_deleted").execute();
    expect(audit.map((a) => a.summary)).toEqual([expect.stringContaining('deleted the bought-in part "Bulkhead fitting"')]);
  });
});

describe("List from the quote", () => {
  /** A quote of the given status with part, labour and fabrication lines, written as the quote screens leave it. */
  async function quoteWith(jobId: number, staffId: string, status: "draft" | "approved", kind: "quote" | "change_order", lines: [string, string, number][]) {
    const at = new Date().toISOString();
    const version = ((await db().selectFrom("quote").select((e) => e.fn.max("version").as("v")).where("job_id", "=", jobId).executeTakeFirst())?.v ?? 0) + 1;
    const quote = await db()
      .insertInto("quote")
      .values({ job_id: jobId, version, kind, status, supersedes_id: null, tax_millipercent: 0, subtotal_cents: 0, taxable_cents: 0, tax_cents: 0, total_cents: 0, deposit_cents: 0, created_by: staffId, created_at: at, updated_at: at })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db()
      .insertInto("quote_line")
      .values(lines.map(([lineKind, description, quantityMilli], position) => ({ quote_id: quote.id, position, kind: lineKind as "part", description, quantity_milli: quantityMilli, unit_price_cents: 5000, taxable: 1, amount_cents: 5000, price_item_id: null })))
      .execute();
  }
  const fromQuote = (cookie: string, jobId: number | string, body: unknown = {}) =>
    fromQuoteRoute.POST(request(`/api/jobs/${jobId}/bought-parts/from-quote`, { cookie, body }), params({ id: String(jobId) }));
  const lines = async (jobId: number) =>
    db().selectFrom("bought_part").select(["kind", "description", "quantity", "unit_cost_cents", "source", "state"]).where("job_id", "=", jobId).orderBy("id").execute();

  it("adds a line for each part line of the approved quote and change orders, cost empty; a second press adds nothing", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    await addBought(tech.cookie, job.id, { kind: "pto", description: "10-bolt PTO, 52 %", quantity: 1 });
    await quoteWith(job.id, tech.staff.id, "draft", "quote", [["part", "Draft only valve", 1000]]);
    await quoteWith(job.id, tech.staff.id, "approved", "quote", [
      ["part", "PTO, 52 % of engine speed", 1000],
      ["part", "Hydraulic pump, 2.5 in³/rev", 1000],
      ["labour", "Install and plumb", 6000],
      ["fabrication", "Reservoir, round 20 in × 30 in", 1000],
      ["part", "Pressure hose, 1 in inside diameter, 12.5 ft", 12_500],
    ]);
    await quoteWith(job.id, tech.staff.id, "approved", "change_order", [["part", "Breakaway coupler pair", 2000]]);

    const res = await fromQuote(tech.cookie, job.id);
    expect(res.status).toBe(201);
    const made = (await readBody(res)).parts as { description: string; state: string }[];
    expect(made.map((p) => p.description)).toEqual(["Hydraulic pump, 2.5 in³/rev", "Pressure hose, 1 in inside diameter, 12.5 ft (quoted quantity 12.5)", "Breakaway coupler pair"]);
    expect(await lines(job.id)).toEqual([
      { kind: "pto", description: "10-bolt PTO, 52 %", quantity: 1, unit_cost_cents: null, source: "manual", state: "needed" },
      { kind: "pump", description: "Hydraulic pump, 2.5 in³/rev", quantity: 1, unit_cost_cents: null, source: "quote", state: "needed" },
      { kind: "hose", description: "Pressure hose, 1 in inside diameter, 12.5 ft (quoted quantity 12.5)", quantity: 1, unit_cost_cents: null, source: "quote", state: "needed" },
      { kind: "fitting", description: "Breakaway coupler pair", quantity: 2, unit_cost_cents: null, source: "quote", state: "needed" },
    ]);

    const again = await fromQuote(tech.cookie, job.id);
    expect(again.status).toBe(409);
    expect((await readBody(again)).error.message).toMatch(/already listed/);
    expect(await lines(job.id)).toHaveLength(4);
  });

  it("refuses a job with no approved quote or no part lines, saying what to do, and adds nothing", async () => {
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    await quoteWith(job.id, office.staff.id, "draft", "quote", [["part", "Valve", 1000]]);
    const none = await fromQuote(office.cookie, job.id);
    expect(none.status).toBe(409);
    expect((await readBody(none)).error.message).toMatch(/no approved quote yet/);
    await quoteWith(job.id, office.staff.id, "approved", "quote", [["labour", "Install", 4000]]);
    const noParts = await fromQuote(office.cookie, job.id);
    expect(noParts.status).toBe(409);
    expect((await readBody(noParts)).error.message).toMatch(/no part lines/);
    expect(await lines(job.id)).toEqual([]);
    expect((await fromQuote(office.cookie, 99_999)).status).toBe(404);
    expect((await fromQuote(office.cookie, "abc")).status).toBe(400);
    expect((await fromQuote(office.cookie, job.id, { extra: 1 })).status).toBe(400);
  });
});

describe("suppliers told apart without capitals or spaces", () => {
  it("lines whose suppliers differ only in capitals or spaces are one group on the parts desk and join one purchase order", async () => {
    const office = await as("office");
    const jobA = await makeJob(db(), { stage: "fabricate" });
    const jobB = await makeJob(db(), { stage: "fabricate" });
    const a = (await readBody(await addBought(office.cookie, jobA.id, { kind: "pump", description: "Gear pump for A", quantity: 1, supplier: "Kestrow Fluid Works" }))).part;
    const b = (await readBody(await addBought(office.cookie, jobB.id, { kind: "hose", description: "Hose for B", quantity: 2, supplier: "  kestrow  fluid works " }))).part;
    const desk = await readBody(await partsDesk.GET(request("/api/parts-desk", { cookie: office.cookie })));
    const groups = desk.toOrder.filter((g: { lines: { id: number }[] }) => g.lines.some((l) => l.id === a.id || l.id === b.id));
    expect(groups.map((g: { supplier: string; lines: { id: number }[] }) => [g.supplier, g.lines.map((l) => l.id).sort()])).toEqual([["Kestrow Fluid Works", [a.id, b.id].sort()]]);
    expect(desk.suppliers.filter((s: string) => /kestrow/i.test(s))).toEqual(["Kestrow Fluid Works"]);

    const res = await purchaseOrders.POST(request("/api/purchase-orders", { cookie: office.cookie, body: { supplier: "Kestrow Fluid Works", partIds: [a.id, b.id], orderedOn: today(), expectedOn: null } }));
    expect(res.status).toBe(201);
    const po = (await readBody(res)).purchaseOrder;
    expect(po.lines.map((l: { supplier: string }) => l.supplier)).toEqual(["Kestrow Fluid Works", "Kestrow Fluid Works"]);
  });
});
