import "server-only";
import { mkdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { photosDir } from "@/db/paths";

export { photosDir };

export type PhotoSize = "display" | "thumb";

function safeKey(key: string) {
  if (!/^[A-Za-z0-9_-]{1,128}$/.test(key)) throw new Error("Unexpected upload key.");
  return key;
}

export function photoPath(jobId: number, uploadKey: string, size: PhotoSize) {
  return join(photosDir(), String(jobId), `${safeKey(uploadKey)}${size === "thumb" ? "-thumb" : ""}.webp`);
}

async function writeAtomically(path: string, data: Buffer) {
  const tmp = `${path}.${process.pid}.tmp`;
  await writeFile(tmp, data);
  await rename(tmp, path);
}

export async function savePhotoFiles(jobId: number, uploadKey: string, files: { display: Buffer; thumb: Buffer }) {
  await mkdir(join(photosDir(), String(jobId)), { recursive: true });
  await writeAtomically(photoPath(jobId, uploadKey, "display"), files.display);
  await writeAtomically(photoPath(jobId, uploadKey, "thumb"), files.thumb);
}

export async function readPhotoFile(jobId: number, uploadKey: string, size: PhotoSize): Promise<Buffer | null> {
  try {
    return await readFile(photoPath(jobId, uploadKey, size));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw err;
  }
}

export async function removePhotoFiles(jobId: number, uploadKey: string) {
  await rm(photoPath(jobId, uploadKey, "display"), { force: true });
  await rm(photoPath(jobId, uploadKey, "thumb"), { force: true });
}
