import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { updateLeakTestProcedure } from "@/server/records/mutations";
import { PUBLISHED_PROCEDURE } from "@/server/records/procedure";
import { recordsSettings } from "@/server/records/queries";
import { leakTestProcedurePatchSchema } from "@/server/records/schemas";

/** The shop's leak-test procedure minimums, with the published figures they default to. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const { procedure } = await recordsSettings(getDb());
    return json({ procedure, published: PUBLISHED_PROCEDURE });
  });
}

/** Only the owner changes the procedure; tests already recorded keep the decision they were saved with. */
export async function PATCH(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const patch = await readJson(req, leakTestProcedurePatchSchema);
    return json({ procedure: await updateLeakTestProcedure(getDb(), owner, patch), published: PUBLISHED_PROCEDURE });
  });
}
