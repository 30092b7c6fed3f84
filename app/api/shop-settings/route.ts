import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { updateLeakAllowance } from "@/server/records/mutations";
import { recordsSettings } from "@/server/records/queries";
import { recordsSettingsPatchSchema } from "@/server/records/schemas";

async function settings() {
  const s = await recordsSettings(getDb());
  return { settings: { leakAllowedDropPsi: s.allowedDropPsi, timeZone: s.timeZone } };
}

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    return json(await settings());
  });
}

/** The owner sets the shop's allowed leak-test drop; tests already recorded keep the allowance they were decided on. */
export async function PATCH(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const patch = await readJson(req, recordsSettingsPatchSchema);
    await updateLeakAllowance(getDb(), owner, patch.leakAllowedDropPsi);
    return json(await settings());
  });
}
