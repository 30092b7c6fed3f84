import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { respond } from "@/server/http/respond";
import { jobsCsv } from "@/server/jobs/export";
import { jobListParamsSchema } from "@/server/jobs/schemas";

/** The Jobs list as CSV, office and owner, with the list's filters (`stage`, `q`, `sort`, `due`, `email`, `customer`, `tech`). */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const raw = Object.fromEntries([...new URL(req.url).searchParams.entries()].filter(([, v]) => v !== ""));
    const { body, filename } = await jobsCsv(getDb(), jobListParamsSchema.parse(raw));
    return new Response(body, { headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${filename}"`, "Cache-Control": "no-store" } });
  });
}
