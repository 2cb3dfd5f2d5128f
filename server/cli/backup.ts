// npm run backup [-- --out DIR]: a consistent copy of the database (also while the app runs) and a
// manifest of its tables and object keys, in a new folder under DIR (default DATA_DIR/backups).
import path from 'node:path';
import { loadConfig } from '../config';
import { backupDatabase, readManifest } from '../maintenance/backup';

const config = loadConfig(process.env);
const at = process.argv.indexOf('--out');
const outDir =
  at >= 0 && process.argv[at + 1] ? path.resolve(process.argv[at + 1]) : path.join(config.dataDir, 'backups');
try {
  const dir = await backupDatabase(config.databasePath, outDir);
  const manifest = await readManifest(dir);
  const rows = Object.values(manifest.tables).reduce((a, b) => a + b, 0);
  console.log(`Backup written to ${dir}`);
  console.log(
    `  ${Object.keys(manifest.tables).length} tables, ${rows} rows, ${manifest.objects.length} object keys in the manifest`,
  );
  console.log('  The objects themselves stay in the clip store; back the store up with its own tools.');
} catch (error) {
  console.error(`The backup failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
}
