import "server-only";
import { fileTypeFromBuffer } from "file-type";
import sharp from "sharp";
import { HEIC_ADVICE, MAX_PHOTO_BYTES, PHOTO_TYPES, type PhotoType } from "./schemas";

export type PhotoCheck =
  | { ok: true; type: PhotoType; display: Buffer; thumb: Buffer; width: number; height: number }
  | { ok: false; reason: string };

/** Long edge of what people see: sharp on a phone, light on a weak connection. */
export const DISPLAY_EDGE = 2048;
export const THUMB_EDGE = 480;

/**
 * Decides what the bytes are by their magic number, never by the file's name or declared type,
 * then re-encodes them. Re-encoding drops every bit of metadata (GPS position, camera serial,
 * EXIF), after turning the picture upright by its orientation tag.
 */
export async function checkAndDerive(bytes: Uint8Array): Promise<PhotoCheck> {
  if (bytes.length === 0) return { ok: false, reason: "The file is empty." };
  if (bytes.length > MAX_PHOTO_BYTES) return { ok: false, reason: `The photo is ${(bytes.length / 1048576).toFixed(1)} MB; the limit is 8 MB.` };
  const detected = await fileTypeFromBuffer(bytes);
  if (!detected) return { ok: false, reason: "That file is not a photo: its contents are not JPEG, PNG or WebP, whatever its name says." };
  if (detected.mime === "image/heic" || detected.mime === "image/heif" || detected.mime === "image/heic-sequence" || detected.mime === "image/heif-sequence") return { ok: false, reason: HEIC_ADVICE };
  if (!(PHOTO_TYPES as readonly string[]).includes(detected.mime)) return { ok: false, reason: `That file is ${detected.ext.toUpperCase()}, not a photo the shop takes (JPEG, PNG or WebP).` };
  try {
    // A picture claiming 30 000 × 30 000 pixels would eat the server's memory; refuse it unread.
    const source = sharp(bytes, { limitInputPixels: 100_000_000, failOn: "error" }).rotate();
    const display = await source.clone().resize(DISPLAY_EDGE, DISPLAY_EDGE, { fit: "inside", withoutEnlargement: true }).webp({ quality: 80 }).toBuffer({ resolveWithObject: true });
    const thumb = await source.clone().resize(THUMB_EDGE, THUMB_EDGE, { fit: "inside", withoutEnlargement: true }).webp({ quality: 70 }).toBuffer();
    return { ok: true, type: detected.mime as PhotoType, display: display.data, thumb, width: display.info.width, height: display.info.height };
  } catch {
    return { ok: false, reason: "The photo could not be read; it may be damaged or too large in pixels. Take it again or send another." };
  }
}
