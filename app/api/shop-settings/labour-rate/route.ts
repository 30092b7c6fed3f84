import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { labourRateCents, setLabourRate } from "@/server/labour/job-cost";
import { labourRateSchema } from "@/server/parts/schemas";

/** The shop's hourly labour rate in cents (office and owner read it; job cost uses it). */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    return json({ labourRateCents: await labourRateCents(getDb()) });
  });
}

/** The owner sets the labour rate; the change is an audit line with the rate before and after. */
export async function PATCH(req: Request) {
  return respond(async () => {
    const owner = await requireStaff(req, ["owner"]);
    const { labourRateCents: cents } = await readJson(req, labourRateSchema);
    await setLabourRate(getDb(), owner, cents);
    return json({ labourRateCents: cents });
  });
}
