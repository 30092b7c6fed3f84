import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { assertSameOrigin, json, readJson, respond } from "@/server/http/respond";
import { clockOff, clockOn } from "@/server/labour/mutations";
import { openClockOf } from "@/server/labour/queries";
import { clockOnSchema } from "@/server/labour/schemas";
import { shopSettings } from "@/server/shop/queries";

/** The signed-in person's running clock (null when off). */
export async function GET(req: Request) {
  return respond(async () => {
    const user = await requireStaff(req);
    const db = getDb();
    return json({ clock: await openClockOf(db, user.id, (await shopSettings(db)).timeZone) });
  });
}

/** Clocks the signed-in person on a job, switching from any job they were on. */
export async function POST(req: Request) {
  return respond(async () => {
    const user = await requireStaff(req);
    const { jobId } = await readJson(req, clockOnSchema);
    const db = getDb();
    const answer = await clockOn(db, user, jobId);
    return json({ entry: answer.entry, closed: answer.closed, clock: await openClockOf(db, user.id, (await shopSettings(db)).timeZone) }, { status: answer.unchanged ? 200 : 201 });
  });
}

/** Clocks the signed-in person off. */
export async function DELETE(req: Request) {
  return respond(async () => {
    const user = await requireStaff(req);
    assertSameOrigin(req);
    return json({ entry: await clockOff(getDb(), user), clock: null });
  });
}
