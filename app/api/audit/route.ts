import { getDb } from "@/db";
import { auditCsv } from "@/server/audit/export";
import { listAudit } from "@/server/audit/queries";
import { auditFilterSchema, filterInput } from "@/server/audit/schemas";
import { requireStaff } from "@/server/auth/session";
import { json, respond } from "@/server/http/respond";
import { recordsSettings } from "@/server/records/queries";

/** The audit trail, owner only: newest first, filtered by kind, person and days; `format=csv` downloads it. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["owner"]);
    const params = new URL(req.url).searchParams;
    const filter = auditFilterSchema.parse(filterInput(params));
    const db = getDb();
    const { timeZone } = await recordsSettings(db);
    if (params.get("format") === "csv") {
      const { body, filename } = await auditCsv(db, filter, timeZone);
      return new Response(body, { headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${filename}"`, "Cache-Control": "no-store" } });
    }
    return json({ entries: await listAudit(db, filter, timeZone) });
  });
}
