import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { moneySettingsSchema } from "@/server/money/schemas";
import { moneySettings, updateMoneySettings } from "@/server/money/settings";

export const dynamic = "force-dynamic";

/** The shop's sales-tax rate, deposit and quote terms. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    return json({ settings: await moneySettings(getDb()) });
  });
}

export async function PUT(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const input = await readJson(req, moneySettingsSchema);
    return json({ settings: await updateMoneySettings(getDb(), owner, input) });
  });
}
