import { getDb } from "@/db";
import { jobCostsCsv, jobCostsReport } from "@/server/labour/report";
import { reportRoute } from "@/server/reports/route";

/** Job cost across jobs clocked in the period: hours by stage, labour and bought-in cost; `format=csv` downloads it. */
export const GET = reportRoute("job-costs", (period, cal) => jobCostsReport(getDb(), period, cal), jobCostsCsv);
