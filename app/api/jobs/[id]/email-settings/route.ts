import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { jobEmailSettings, saveJobEmailSettings } from "@/server/email/recipients";
import { emailSettingsSchema } from "@/server/email/schemas";
import { json, parseId, readJson, respond } from "@/server/http/respond";

export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Job");
    return json({ settings: await jobEmailSettings(getDb(), id) });
  });
}

/** Who of the customer's contacts gets this job's e-mail, and whether it goes at all. Office and owner. */
export async function PUT(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    const id = parseId((await ctx.params).id, "Job");
    const input = await readJson(req, emailSettingsSchema);
    return json({ settings: await saveJobEmailSettings(getDb(), actor, id, input) });
  });
}
