import "server-only";
import type { DB } from "@/db";
import { recordAudit } from "@/server/audit/record";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import type { ShopDetailsInput } from "./schemas";

export interface ShopDetails {
  version: number;
  name: string;
  phone: string;
  address: string;
  timeZone: string;
  workOrderPrefix: string;
  holidays: { day: string; name: string }[];
  showPredictedDate: boolean;
  leakAllowedDropPsi: number;
}

export async function shopDetails(db: DB): Promise<ShopDetails> {
  const [row, holidays] = await Promise.all([
    db.selectFrom("shop").select(["name", "phone", "address", "time_zone", "work_order_prefix", "show_predicted_date", "settings_version", "leak_allowed_drop_psi"]).where("id", "=", 1).executeTakeFirst(),
    db.selectFrom("shop_holiday").select(["day", "name"]).orderBy("day").execute(),
  ]);
  return {
    version: row?.settings_version ?? 1,
    name: row?.name ?? "Your shop",
    phone: row?.phone ?? "",
    address: row?.address ?? "",
    timeZone: row?.time_zone ?? "US/Central",
    workOrderPrefix: row?.work_order_prefix ?? "WO",
    holidays,
    showPredictedDate: (row?.show_predicted_date ?? 0) === 1,
    leakAllowedDropPsi: row?.leak_allowed_drop_psi ?? 0.05,
  };
}

const WORDS: Record<Exclude<keyof ShopDetails, "version">, string> = {
  name: "name",
  phone: "phone",
  address: "address",
  timeZone: "time zone",
  workOrderPrefix: "work-order prefix",
  holidays: "holidays",
  showPredictedDate: "likely ready date on the status page",
  leakAllowedDropPsi: "allowed leak-test drop (psi)",
};

const shown = (v: unknown) => (Array.isArray(v) ? v.map((h) => h.day).join(", ") || "none" : typeof v === "boolean" ? (v ? "shown" : "not shown") : String(v) || "empty");

/**
 * The owner saves the shop's details. A form older than the last save is refused (409 `stale`)
 * with the current details, so nobody overwrites a change they never saw; a save that changes
 * nothing writes nothing. Takes effect at once: every page reads these on each request.
 */
export async function saveShopDetails(db: DB, actor: StaffUser, input: ShopDetailsInput): Promise<ShopDetails> {
  await db.transaction().execute(async (trx) => {
    const exists = await trx.selectFrom("shop").select("id").where("id", "=", 1).executeTakeFirst();
    if (!exists) await trx.insertInto("shop").values({ id: 1, name: "Your shop" }).execute();
    const before = await shopDetails(trx as unknown as DB);
    if (before.version !== input.version) {
      throw new ApiError("stale", "Someone else saved the shop's settings first. The form now shows what they saved; make your change again.", { settings: before });
    }
    const holidays = [...input.holidays].sort((a, b) => a.day.localeCompare(b.day));
    const after = { ...input, holidays };
    const changed = (Object.keys(WORDS) as (keyof typeof WORDS)[]).filter((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]));
    if (changed.length === 0) return;
    await trx
      .updateTable("shop")
      .set({
        name: input.name,
        phone: input.phone,
        address: input.address,
        time_zone: input.timeZone,
        work_order_prefix: input.workOrderPrefix,
        show_predicted_date: input.showPredictedDate ? 1 : 0,
        leak_allowed_drop_psi: input.leakAllowedDropPsi,
        settings_version: before.version + 1,
      })
      .where("id", "=", 1)
      .execute();
    if (changed.includes("holidays")) {
      await trx.deleteFrom("shop_holiday").execute();
      if (holidays.length) await trx.insertInto("shop_holiday").values(holidays).execute();
    }
    await recordAudit(trx, {
      kind: "settings_changed",
      actor,
      subject: "Shop details",
      summary: `${actor.name} changed the shop's ${changed.map((k) => `${WORDS[k]} (${shown(before[k])} → ${shown(after[k])})`).join("; ")}.`,
      details: Object.fromEntries(changed.map((k) => [k, [before[k], after[k]]])),
    });
  });
  return shopDetails(db);
}
