import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { json, respond } from "@/server/http/respond";
import { existingJobId } from "@/server/jobs/queries";
import { latestKitSpec } from "@/server/kit-spec/queries";
import { kitSpecLines } from "@/server/money/kit-lines";
import { listPriceItems } from "@/server/money/price-list";

export const dynamic = "force-dynamic";

/** The lines "Start from the kit spec" fills a draft with; nothing is saved until the draft is. */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const db = getDb();
    const id = await existingJobId(db, (await ctx.params).id);
    const spec = await latestKitSpec(db, id);
    if (!spec) throw new ApiError("conflict", "This job has no saved kit spec. Save one in the Kit spec section first, or add the lines by hand.");
    const { lines, unpriced } = kitSpecLines(spec.inputs, spec.results, await listPriceItems(db));
    return json({ specVersion: spec.version, lines, unpriced });
  });
}
