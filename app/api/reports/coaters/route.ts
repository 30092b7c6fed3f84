import { getDb } from "@/db";
import { coatersCsv } from "@/server/reports/csv";
import { coatersReport } from "@/server/reports/queries";
import { reportRoute } from "@/server/reports/route";

export const GET = reportRoute("coaters", (period, cal) => coatersReport(getDb(), period, cal), coatersCsv);
