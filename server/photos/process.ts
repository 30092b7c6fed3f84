import "server-only";
import { fileTypeFromBuffer } from "file-type";
import sharp from "sharp";
import { type DecodeTicket, inDecodeLine } from "./decode-line";
import { HEIC_ADVICE, MAX_PHOTO_BYTES, MAX_PHOTO_PIXELS, PHOTO_TYPES, type PhotoType } from "./schemas";

// Decoded pixels are not worth keeping between photos: without this, sharp's cache held hundreds
// of megabytes long after the last upload.
sharp.cache(false);

export type PhotoCheck =
  | { ok: true; type: PhotoType; display: Buffer; thumb: Buffer; width: number; height: number }
  | { ok: false; reason: string };

/** Long edge of what people see: sharp on a phone, light on a weak connection. */
export const DISPLAY_EDGE = 2048;
export const THUMB_EDGE = 480;

function megapixels(pixels: number) {
  return `${Math.round(pixels / 1_000_000)} megapixels`;
}

/**
 * Decides what the bytes are by their magic number, never by the file's name or declared type,
 * then re-encodes them. Re-encoding drops every bit of metadata (GPS position, camera serial,
 * EXIF), after turning the picture upright by its orientation tag. The header is read first, so
 * a photo bigger in pixels than a phone camera takes is refused before anything is decoded; the
 * decode itself waits its turn in the process's line (`ticket` names it there).
 */
export async function checkAndDerive(bytes: Uint8Array, ticket: DecodeTicket = { jobId: 0, name: "photo", uploadedBy: "" }): Promise<PhotoCheck> {
  if (bytes.length === 0) return { ok: false, reason: "The file is empty." };
  if (bytes.length > MAX_PHOTO_BYTES) return { ok: false, reason: `The photo is ${(bytes.length / 1048576).toFixed(1)} MB; the limit is 8 MB.` };
  const detected = await fileTypeFromBuffer(bytes);
  if (!detected) return { ok: false, reason: "That file is not a photo: its contents are not JPEG, PNG or WebP, whatever its name says." };
  if (detected.mime === "image/heic" || detected.mime === "image/heif" || detected.mime === "image/heic-sequence" || detected.mime === "image/heif-sequence") return { ok: false, reason: HEIC_ADVICE };
  if (!(PHOTO_TYPES as readonly string[]).includes(detected.mime)) return { ok: false, reason: `That file is ${detected.ext.toUpperCase()}, not a photo the shop takes (JPEG, PNG or WebP).` };
  let width: number | undefined;
  let height: number | undefined;
  try {
    ({ width, height } = await sharp(bytes).metadata());
  } catch {
    width = undefined;
  }
  if (!width || !height) return { ok: false, reason: "The photo could not be read; it may be damaged. Take it again or send another." };
  if (width * height > MAX_PHOTO_PIXELS) {
    return {
      ok: false,
      reason: `The photo is ${width} × ${height} pixels (${megapixels(width * height)}); the shop takes up to ${megapixels(MAX_PHOTO_PIXELS)}, what a phone camera makes. Send it at the camera's normal size, or shrink it first.`,
    };
  }
  return inDecodeLine(ticket, () => derive(bytes, detected.mime as PhotoType));
}

async function derive(bytes: Uint8Array, type: PhotoType): Promise<PhotoCheck> {
  try {
    const source = sharp(bytes, { limitInputPixels: MAX_PHOTO_PIXELS, failOn: "error" }).rotate();
    const display = await source.clone().resize(DISPLAY_EDGE, DISPLAY_EDGE, { fit: "inside", withoutEnlargement: true }).webp({ quality: 80 }).toBuffer({ resolveWithObject: true });
    const thumb = await source.clone().resize(THUMB_EDGE, THUMB_EDGE, { fit: "inside", withoutEnlargement: true }).webp({ quality: 70 }).toBuffer();
    return { ok: true, type, display: display.data, thumb, width: display.info.width, height: display.info.height };
  } catch {
    return { ok: false, reason: "The photo could not be read; it may be damaged. Take it again or send another." };
  }
}
