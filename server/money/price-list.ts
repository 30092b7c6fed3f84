import "server-only";
import type { DB } from "@/db";
import type { KitUse, LineKind } from "@/db/tables/money";
import { recordAudit, type AuditActor } from "@/server/audit/record";
import { ApiError } from "@/server/http/errors";
import type { PriceItemInput, PriceItemPatch } from "./schemas";
import { formatCents, fromThousandths, toThousandths } from "./totals";

export interface PriceItem {
  id: number;
  kind: LineKind;
  name: string;
  unit: string;
  unitPriceCents: number;
  taxable: boolean;
  kitUse: KitUse | null;
  sizeIn: number | null;
  active: boolean;
  updatedAt: string;
}

const COLUMNS = ["id", "kind", "name", "unit", "unit_price_cents", "taxable", "kit_use", "size_milli_in", "active", "updated_at"] as const;

type Row = { id: number; kind: LineKind; name: string; unit: string; unit_price_cents: number; taxable: number; kit_use: KitUse | null; size_milli_in: number | null; active: number; updated_at: string };

const toItem = (r: Row): PriceItem => ({
  id: r.id,
  kind: r.kind,
  name: r.name,
  unit: r.unit,
  unitPriceCents: r.unit_price_cents,
  taxable: r.taxable === 1,
  kitUse: r.kit_use,
  sizeIn: r.size_milli_in === null ? null : fromThousandths(r.size_milli_in),
  active: r.active === 1,
  updatedAt: r.updated_at,
});

const KIND_ORDER: Record<LineKind, number> = { labour: 0, part: 1, fabrication: 2, coating: 3, fee: 4 };

/** The price list, grouped by kind then name; items taken off the list are included only when asked. */
export async function listPriceItems(db: DB, { includeInactive = false } = {}): Promise<PriceItem[]> {
  let q = db.selectFrom("price_item").select(COLUMNS);
  if (!includeInactive) q = q.where("active", "=", 1);
  const rows = await q.orderBy("name").execute();
  return rows.map(toItem).sort((a, b) => KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || a.name.localeCompare(b.name));
}

function describe(item: Pick<PriceItem, "name" | "unit" | "unitPriceCents" | "taxable">) {
  return `${item.name} at ${formatCents(item.unitPriceCents)} per ${item.unit}${item.taxable ? ", taxable" : ", not taxed"}`;
}

export async function addPriceItem(db: DB, actor: AuditActor, input: PriceItemInput): Promise<PriceItem> {
  const now = new Date().toISOString();
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto("price_item")
      .values({
        kind: input.kind,
        name: input.name,
        unit: input.unit,
        unit_price_cents: input.unitPriceCents,
        taxable: input.taxable ? 1 : 0,
        kit_use: input.kitUse ?? null,
        size_milli_in: input.sizeIn == null ? null : toThousandths(input.sizeIn),
        created_at: now,
        updated_at: now,
      })
      .returning(COLUMNS)
      .executeTakeFirstOrThrow();
    const item = toItem(row);
    await recordAudit(trx, { kind: "price_changed", actor, subject: item.name, summary: `${actor.name} added ${describe(item)} to the price list.`, details: { added: item } });
    return item;
  });
}

/** Changes a price; quotes already written keep the price they were written with. */
export async function updatePriceItem(db: DB, actor: AuditActor, id: number, patch: PriceItemPatch): Promise<PriceItem> {
  return db.transaction().execute(async (trx) => {
    const row = await trx.selectFrom("price_item").select(COLUMNS).where("id", "=", id).executeTakeFirst();
    if (!row) throw new ApiError("not_found", "That price-list item was not found. Reload the price list.");
    const before = toItem(row);
    const after: PriceItem = {
      ...before,
      ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)),
      kitUse: patch.kitUse === undefined ? before.kitUse : patch.kitUse,
      sizeIn: patch.sizeIn === undefined ? before.sizeIn : patch.sizeIn,
    };
    const changed = (["kind", "name", "unit", "unitPriceCents", "taxable", "kitUse", "sizeIn", "active"] as const).filter((k) => after[k] !== before[k]);
    if (!changed.length) return before;
    const now = new Date().toISOString();
    const saved = await trx
      .updateTable("price_item")
      .set({
        kind: after.kind,
        name: after.name,
        unit: after.unit,
        unit_price_cents: after.unitPriceCents,
        taxable: after.taxable ? 1 : 0,
        kit_use: after.kitUse,
        size_milli_in: after.sizeIn === null ? null : toThousandths(after.sizeIn),
        active: after.active ? 1 : 0,
        updated_at: now,
      })
      .where("id", "=", id)
      .returning(COLUMNS)
      .executeTakeFirstOrThrow();
    const words =
      changed.length === 1 && changed[0] === "unitPriceCents"
        ? `${actor.name} changed the price of ${after.name} from ${formatCents(before.unitPriceCents)} to ${formatCents(after.unitPriceCents)} per ${after.unit}.`
        : changed.length === 1 && changed[0] === "active"
          ? `${actor.name} ${after.active ? "put back" : "took off"} ${after.name} ${after.active ? "on" : ""} the price list.`.replace("  ", " ")
          : `${actor.name} changed ${before.name}: now ${describe(after)}${after.active ? "" : " (off the list)"}.`;
    await recordAudit(trx, {
      kind: "price_changed",
      actor,
      subject: after.name,
      summary: words,
      details: Object.fromEntries(changed.map((k) => [k, [before[k], after[k]]])),
    });
    return toItem(saved);
  });
}
