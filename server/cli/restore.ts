// npm run restore -- DIR: puts the backup in DIR back as the database (stop the app first). Checks the
// copy against its manifest, and says which object keys of the manifest the clip store lacks.
import path from 'node:path';
import { loadConfig } from '../config';
import { restoreDatabase } from '../maintenance/backup';
import { ObjectStorage } from '../storage/object-storage';

const config = loadConfig(process.env);
const dir = process.argv[2];
if (!dir) {
  console.error('Name the backup folder: npm run restore -- data/backups/2026-12-02T18-00-00-000Z');
  process.exit(2);
}
try {
  const manifest = await restoreDatabase(path.resolve(dir), config.databasePath);
  console.log(`Restored the database of ${manifest.createdAt} to ${config.databasePath}`);
  if (config.s3.endpoint) {
    const storage = new ObjectStorage({ ...config.s3, endpoint: config.s3.endpoint });
    const missing: string[] = [];
    for (const key of manifest.objects) if (!(await storage.exists(key))) missing.push(key);
    storage.close();
    console.log(
      missing.length === 0
        ? `All ${manifest.objects.length} objects of the manifest are in the store.`
        : `${missing.length} of ${manifest.objects.length} objects are missing from the store:\n  ${missing.join('\n  ')}`,
    );
  } else {
    console.log('The clip store is the embedded one; its files under DATA_DIR/s3 are left as they are.');
  }
} catch (error) {
  console.error(`The restore failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
}
