import { getDb } from "@/db";
import { requireStaff } from "@/server/auth/session";
import { notFound } from "@/server/http/errors";
import { assertSameOrigin, json, parseId, readJson, respond } from "@/server/http/respond";
import { deletePhoto, patchPhoto } from "@/server/photos/mutations";
import { findPhoto } from "@/server/photos/queries";
import { photoPatchSchema } from "@/server/photos/schemas";
import { readPhotoFile } from "@/server/photos/store";

/** The photo itself, for staff (`?size=thumb` for the small copy). Customers use their status link. */
export async function GET(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    await requireStaff(req);
    const id = parseId((await ctx.params).id, "Photo");
    const size = new URL(req.url).searchParams.get("size") === "thumb" ? "thumb" : "display";
    const photo = await findPhoto(getDb(), id);
    if (!photo) throw notFound("That photo");
    const bytes = await readPhotoFile(photo.job_id, photo.upload_key, size);
    if (!bytes) throw notFound("That photo's file");
    return new Response(new Uint8Array(bytes), {
      headers: { "Content-Type": "image/webp", "Content-Length": String(bytes.length), "Cache-Control": "private, max-age=3600", "X-Content-Type-Options": "nosniff" },
    });
  });
}

/** Caption, stage and whether the customer sees it. Any staff member: the tech who took it knows best. */
export async function PATCH(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req);
    const id = parseId((await ctx.params).id, "Photo");
    const patch = await readJson(req, photoPatchSchema);
    return json({ photo: await patchPhoto(getDb(), actor, id, patch) });
  });
}

export async function DELETE(req: Request, ctx: { params: Promise<{ id: string }> }) {
  return respond(async () => {
    const actor = await requireStaff(req, ["office", "owner"]);
    assertSameOrigin(req);
    const id = parseId((await ctx.params).id, "Photo");
    return json(await deletePhoto(getDb(), actor, id));
  });
}
