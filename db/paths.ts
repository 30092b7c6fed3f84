import { dirname, join, resolve } from "node:path";

/** Where the shop's data lives. One place, so the server, backup and restore agree. */
export function databasePath(): string {
  return resolve(/*turbopackIgnore: true*/ process.env.DATABASE_PATH ?? "data/baywright.db");
}

/** Derived photos live on the shop's own disk (gitignored data/), never in a public folder. */
export function photosDir(): string {
  return resolve(/*turbopackIgnore: true*/ process.env.PHOTOS_DIR || "data/photos");
}

/** The status-link secret's file, beside the database (unless STATUS_LINK_SECRET is set). */
export function statusLinkSecretPath(): string {
  return join(dirname(databasePath()), "status-link.secret");
}

export function backupsDir(): string {
  return resolve(/*turbopackIgnore: true*/ process.env.BACKUP_DIR || "backups");
}
