import { BackupError, DEFAULT_KEEP, backupShop } from "@/db/backup";

const usage = "Usage: npm run db:backup -- [folder] [--keep N]   (folder defaults to BACKUP_DIR or ./backups; N to BACKUP_KEEP or 14)";

function parse(argv: string[]) {
  let into: string | undefined;
  let keep = process.env.BACKUP_KEEP ? Number(process.env.BACKUP_KEEP) : DEFAULT_KEEP;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === "--keep") keep = Number(argv[++i]);
    else if (arg.startsWith("--keep=")) keep = Number(arg.slice("--keep=".length));
    else if (arg === "--help" || arg === "-h") {
      console.log(usage);
      process.exit(0);
    } else if (arg.startsWith("-")) throw new BackupError(`Unknown option ${arg}. ${usage}`);
    else into = arg;
  }
  if (!Number.isInteger(keep) || keep < 1) throw new BackupError(`--keep (or BACKUP_KEEP) must be a whole number of 1 or more. ${usage}`);
  return { into, keep };
}

try {
  const { into, keep } = parse(process.argv.slice(2));
  const { folder, manifest, removed } = await backupShop({ into, keep });
  const rows = Object.values(manifest.database.tables).reduce((a, b) => a + b, 0);
  console.log(`Backed up to ${folder}`);
  console.log(`  database: ${rows} rows in ${Object.keys(manifest.database.tables).length} tables, integrity ok`);
  console.log(`  photos: ${manifest.photos.files.length} ${manifest.photos.files.length === 1 ? "file" : "files"}`);
  console.log(
    `  status-link secret: ${manifest.statusLinkSecret === "file" ? "included" : manifest.statusLinkSecret === "environment" ? "set in STATUS_LINK_SECRET, keep it with the server's settings" : "none issued yet"}`,
  );
  if (removed.length) console.log(`  removed ${removed.length} older ${removed.length === 1 ? "backup" : "backups"} (keeping ${keep}): ${removed.join(", ")}`);
} catch (err) {
  console.error(err instanceof BackupError ? err.message : err);
  process.exit(1);
}
