import { getDb } from "@/db";
import { throughputCsv } from "@/server/reports/csv";
import { throughputReport } from "@/server/reports/queries";
import { reportRoute } from "@/server/reports/route";

export const GET = reportRoute("throughput", (period, cal) => throughputReport(getDb(), period, cal), throughputCsv);
