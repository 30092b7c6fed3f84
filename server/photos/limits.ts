/** What a photo upload may be: checked in the browser before sending and again on the server. */
export const MAX_PHOTO_BYTES = 8 * 1024 * 1024;
export const MAX_PHOTO_SIZE_LABEL = "8MB";
export const MAX_PHOTOS_PER_UPLOAD = 10;
/** What a phone camera makes at most (12 to 50 megapixels at their usual settings, from memory); a bigger picture costs too much memory to decode. */
export const MAX_PHOTO_PIXELS = 50_000_000;
/** What the shop takes: what phones and cameras write and this server can read. */
export const PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp"] as const;
export type PhotoType = (typeof PHOTO_TYPES)[number];
export const HEIC_ADVICE = "HEIC photos cannot be read here. Set the phone's camera to the most compatible format (JPEG), or pick the photo from the camera button, which sends JPEG.";
