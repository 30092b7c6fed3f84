import fc from "fast-check";
import { describe, expect, it, beforeAll } from "vitest";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));

/*
 * A column is an ordered list of cards. The model below is that list and nothing else: a move
 * takes the card out of its list and puts it in front of the chosen card, or at the end. After
 * every move the database's columns, read in position order, must be those lists, numbered
 * 0, 1, 2… with no gaps and no two cards on one place.
 */
type Columns = Record<"queued" | "fabricate", number[]>;

function applyModel(columns: Columns, card: number, to: keyof Columns, before: number | null) {
  for (const list of Object.values(columns)) {
    const at = list.indexOf(card);
    if (at >= 0) list.splice(at, 1);
  }
  const target = columns[to];
  target.splice(before === null ? target.length : target.indexOf(before), 0, card);
}

async function readColumns(): Promise<Columns> {
  const rows = await db().selectFrom("job").select(["id", "stage", "position"]).where("stage", "in", ["queued", "fabricate"]).orderBy("position").execute();
  const out: Columns = { queued: [], fabricate: [] };
  for (const stage of ["queued", "fabricate"] as const) {
    const column = rows.filter((r) => r.stage === stage);
    expect(column.map((r) => r.position)).toEqual(column.map((_, i) => i));
    out[stage] = column.map((r) => r.id);
  }
  return out;
}

describe("card positions after any sequence of moves", () => {
  it("match the plain list model: moves between columns, to the end, in front of a card, and reorders", async () => {
    await ensureShop(db());
    const owner = await makeStaff(db(), "owner");
    const cookie = await sessionCookieFor(owner.id);
    const ids: number[] = [];
    for (let i = 0; i < 5; i++) ids.push((await makeJob(db(), { stage: "queued" })).id);
    for (let i = 0; i < 4; i++) ids.push((await makeJob(db(), { stage: "fabricate" })).id);
    const model = await readColumns();

    const step = fc.record({ card: fc.nat(ids.length - 1), to: fc.constantFrom("queued" as const, "fabricate" as const), before: fc.option(fc.nat(ids.length - 1), { nil: null }) });
    const sequence = fc.sample(fc.array(step, { minLength: 80, maxLength: 80 }), { numRuns: 1, seed: 20260 })[0];
    for (const s of sequence) {
      const card = ids[s.card];
      const target = model[s.to];
      // In front of a card that is in the target column and is not the moving card itself; else at the end.
      const before = s.before !== null && target.includes(ids[s.before]) && ids[s.before] !== card ? ids[s.before] : null;
      const { version } = await db().selectFrom("job").select("version").where("id", "=", card).executeTakeFirstOrThrow();
      const res = await moves.POST(request(`/api/jobs/${card}/moves`, { cookie, body: { toStage: s.to, version, ...(before ? { beforeJobId: before } : {}) } }), params({ id: String(card) }));
      expect(res.status, JSON.stringify(await readBody(res.clone()))).toBe(200);
      applyModel(model, card, s.to, before);
      expect(await readColumns()).toEqual(model);
    }
  });

  it("refuses a place in front of the moving card itself, or of a card in another column, and changes nothing", async () => {
    const owner = await makeStaff(db(), "owner");
    const cookie = await sessionCookieFor(owner.id);
    const card = await makeJob(db(), { stage: "queued" });
    const elsewhere = await makeJob(db(), { stage: "fabricate" });
    const before = await readColumns();
    for (const beforeJobId of [card.id, elsewhere.id]) {
      const res = await moves.POST(request(`/api/jobs/${card.id}/moves`, { cookie, body: { toStage: "queued", version: card.version, beforeJobId } }), params({ id: String(card.id) }));
      expect(res.status).toBe(400);
      expect(((await readBody(res)) as { error: { details: { fields: object } } }).error.details.fields).toHaveProperty("beforeJobId");
    }
    expect(await readColumns()).toEqual(before);
  });
});
