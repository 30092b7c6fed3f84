import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { setMoneyChecks } from "@/server/money/money-checks";

const schema = z.strictObject({ on: z.boolean({ error: "Say on (true) or off (false)." }) }, { error: "Send { on: true } or { on: false }." });

/** "Money checks before work and delivery": the owner turns them on or off. */
export async function PUT(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const { on } = await readJson(req, schema);
    return json({ on: await setMoneyChecks(getDb(), owner, on) });
  });
}
