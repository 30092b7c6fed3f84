import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { computeKitSpec, kitCalcInputSchema } from "@/server/kit-calc";


// A POST because the inputs are a nested object; nothing is stored.
export async function POST(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const input = await readJson(req, kitCalcInputSchema);
    return json(computeKitSpec(input));
  });
}
