import { z } from "zod";
import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { listCoatingRuns } from "@/server/records/queries";
import { sendCoatingRun } from "@/server/records/run-moves";
import { coatingRunSchema } from "@/server/records/schemas";

const listFilter = z.object({
  status: z.enum(["current", "open", "all"], { error: "status is current, open or all." }).default("current"),
});

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const raw = Object.fromEntries([...new URL(req.url).searchParams.entries()].filter(([, v]) => v !== ""));
    return json({ runs: await listCoatingRuns(getDb(), listFilter.parse(raw)) });
  });
}

/** The office sends parts out to a coater, and may move the ticked jobs into Outside coating with them. */
export async function POST(req: Request) {
  return respond(async () => {
    const actor = await requireStaff(req, ["owner", "office"]);
    const input = await readJson(req, coatingRunSchema);
    return json(await sendCoatingRun(getDb(), actor, input), { status: 201 });
  });
}
