import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { json, readJson, respond } from "@/server/http/respond";
import { createJob } from "@/server/jobs/mutations";
import { listJobs } from "@/server/jobs/queries";
import { newJobSchema, stageSchema } from "@/server/jobs/schemas";
import { z } from "zod";

const listFilter = z.object({
  stage: stageSchema.optional(),
  customerId: z.coerce.number().int().positive().optional(),
  truckId: z.coerce.number().int().positive().optional(),
  q: z.string().trim().max(60).optional(),
  sort: z.enum(["newest", "due", "customer", "stage"]).optional(),
  limit: z.coerce.number().int().min(1).max(500).optional(),
  offset: z.coerce.number().int().min(0).max(1_000_000).optional(),
});

export async function GET(req: Request) {
  return respond(async () => {
    await requireStaff(req);
    const raw = Object.fromEntries([...new URL(req.url).searchParams.entries()].filter(([, v]) => v !== ""));
    return json({ jobs: await listJobs(getDb(), listFilter.parse(raw)) });
  });
}

export async function POST(req: Request) {
  return respond(async () => {
    const actor = await requireStaff(req, ["owner", "office"]);
    const input = await readJson(req, newJobSchema);
    return json({ job: await createJob(getDb(), actor, input) }, { status: 201 });
  });
}
