import { BackupError, restoreShop } from "@/db/backup";

const [backup, ...rest] = process.argv.slice(2);
if (!backup || rest.length) {
  console.error("Usage: npm run db:restore <backup folder>   (a folder made by npm run db:backup; stop the app first)");
  process.exit(1);
}
try {
  const result = restoreShop(backup);
  const rows = Object.values(result.tables).reduce((a, b) => a + b, 0);
  console.log(`Restored ${backup}`);
  console.log(`  database: ${result.database} (${rows} rows, integrity ok, every table's count matches the backup)`);
  console.log(`  photos: ${result.photos} (${result.photoFiles} ${result.photoFiles === 1 ? "file" : "files"}, each matches the backup)`);
  if (result.setAside.length) console.log(`  what was there before is kept as: ${result.setAside.join(", ")}`);
  console.log("Start the app again: npm start");
} catch (err) {
  console.error(err instanceof BackupError ? err.message : err);
  process.exit(1);
}
