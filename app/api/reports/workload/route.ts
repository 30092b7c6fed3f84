import { getDb } from "@/db";
import { workloadCsv } from "@/server/reports/csv";
import { workloadReport } from "@/server/reports/queries";
import { reportRoute } from "@/server/reports/route";

export const GET = reportRoute("workload", (period, cal) => workloadReport(getDb(), period, cal), workloadCsv);
