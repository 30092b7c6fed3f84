import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notifySettingsSchema } from "@/server/email/schemas";
import { notifySettings, saveNotifySettings } from "@/server/email/settings";
import { json, readJson, respond } from "@/server/http/respond";

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    return json({ settings: await notifySettings(getDb()) });
  });
}

/** Which stages e-mail the customer, and how long status links last after delivery. */
export async function PUT(req: Request) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const input = await readJson(req, notifySettingsSchema);
    return json({ settings: await saveNotifySettings(getDb(), actor, input) });
  });
}
