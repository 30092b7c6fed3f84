import "server-only";
import type { DB } from "@/db";

export interface ShopSettings {
  name: string;
  phone: string;
  timeZone: string;
  workOrderPrefix: string;
}

const DEFAULT_SHOP: ShopSettings = { name: "Your shop", phone: "", timeZone: "US/Central", workOrderPrefix: "WO" };

export async function shopSettings(db: DB): Promise<ShopSettings> {
  const row = await db.selectFrom("shop").select(["name", "phone", "time_zone", "work_order_prefix"]).where("id", "=", 1).executeTakeFirst();
  if (!row) return DEFAULT_SHOP;
  return { name: row.name, phone: row.phone, timeZone: row.time_zone, workOrderPrefix: row.work_order_prefix };
}

/** The days the shop is closed, as YYYY-MM-DD: business days skip them everywhere. */
export async function shopHolidays(db: DB): Promise<Set<string>> {
  const rows = await db.selectFrom("shop_holiday").select("day").execute();
  return new Set(rows.map((r) => r.day));
}
