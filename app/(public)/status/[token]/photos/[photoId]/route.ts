import { getDb } from "@/db";
import { readPhotoFile } from "@/server/photos/store";
import { openStatusLink, statusPhoto } from "@/server/status/queries";

const PRIVATE = {
  "Referrer-Policy": "no-referrer",
  "X-Robots-Tag": "noindex, nofollow",
  "Cache-Control": "no-store",
  "X-Content-Type-Options": "nosniff",
};

function refuse(status: 404 | 410, message: string) {
  return new Response(message, { status, headers: { ...PRIVATE, "Content-Type": "text/plain; charset=utf-8" } });
}

/**
 * A photo for the customer: only through a working status link, only of that link's job, and
 * only when the shop marked it for the customer. Everything else is the same "not found".
 */
export async function GET(req: Request, ctx: { params: Promise<{ token: string; photoId: string }> }) {
  const { token, photoId } = await ctx.params;
  if (!/^[1-9][0-9]{0,9}$/.test(photoId)) return refuse(404, "Photo not found.");
  const db = getDb();
  const link = await openStatusLink(db, token);
  if (link.state === "revoked" || link.state === "expired") return refuse(410, "This status link no longer works. Ask the shop for a new one.");
  if (link.state !== "active") return refuse(404, "Photo not found.");
  const photo = await statusPhoto(db, link.jobId, Number(photoId));
  if (!photo) return refuse(404, "Photo not found.");
  const size = new URL(req.url).searchParams.get("size") === "thumb" ? "thumb" : "display";
  const bytes = await readPhotoFile(photo.job_id, photo.upload_key, size);
  if (!bytes) return refuse(404, "Photo not found.");
  return new Response(new Uint8Array(bytes), { headers: { ...PRIVATE, "Content-Type": "image/webp", "Content-Length": String(bytes.length) } });
}
