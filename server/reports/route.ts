import "server-only";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { validationError } from "@/server/http/errors";
import { json, respond } from "@/server/http/respond";
import type { Period } from "./compute";
import { csvFilename } from "./csv";
import { readPeriod } from "./period";
import { type ReportCalendar, reportCalendar } from "./queries";

/**
 * One report's GET: office and owner, `from` and `to` (YYYY-MM-DD on the shop's calendar), JSON
 * by default and CSV with `format=csv`.
 */
export function reportRoute<T>(name: string, load: (period: Period, cal: ReportCalendar) => Promise<T>, csv: (report: T) => string) {
  return (req: Request) =>
    respond(async () => {
      await requireStaff(req, ["office", "owner"]);
      const db = getDb();
      const cal = await reportCalendar(db);
      const search = new URL(req.url).searchParams;
      const read = readPeriod(search, cal.today);
      if (!read.ok) throw validationError(read.error);
      const report = await load(read.period, cal);
      if (search.get("format") === "csv") {
        return new Response(csv(report), {
          headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${csvFilename(name, read.period)}"`, "Cache-Control": "no-store" },
        });
      }
      return json(report);
    });
}
