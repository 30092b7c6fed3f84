import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { respond } from "@/server/http/respond";
import { coatingRunsCsv } from "@/server/records/export";

const exportFilter = z.object({
  status: z.enum(["current", "open", "all"], { error: "status is current, open or all." }).default("all"),
});

/** Coating runs as CSV, office and owner: every run by default, or `status=open|current` as the Coating page lists them. */
export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req, ["office", "owner"]);
    const raw = Object.fromEntries([...new URL(req.url).searchParams.entries()].filter(([, v]) => v !== ""));
    const { body, filename } = await coatingRunsCsv(getDb(), exportFilter.parse(raw).status);
    return new Response(body, { headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${filename}"`, "Cache-Control": "no-store" } });
  });
}
