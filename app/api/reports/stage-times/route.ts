import { getDb } from "@/db";
import { stageTimesCsv } from "@/server/reports/csv";
import { stageTimesReport } from "@/server/reports/queries";
import { reportRoute } from "@/server/reports/route";

export const GET = reportRoute("stage-times", (period, cal) => stageTimesReport(getDb(), period, cal), stageTimesCsv);
