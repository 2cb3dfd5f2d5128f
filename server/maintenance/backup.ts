import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import fs from 'node:fs/promises';
import path from 'node:path';
import Database from 'better-sqlite3';

/** What a backup holds besides the database copy: enough to check it and to find the media again. */
export interface BackupManifest {
  createdAt: string;
  database: { file: string; sha256: string; bytes: number; migrations: string[] };
  /** Rows per table at the moment of the copy. */
  tables: Record<string, number>;
  /** Every object key the database refers to (clip originals, playable copies, posters, thumbnails). */
  objects: string[];
}

const DATABASE_FILE = 'stanceline.sqlite';
const MANIFEST_FILE = 'manifest.json';

async function sha256(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

function describe(
  db: Database.Database,
): Pick<BackupManifest, 'tables' | 'objects'> & { migrations: string[] } {
  const names = (
    db
      .prepare(
        `SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name`,
      )
      .all() as {
      name: string;
    }[]
  ).map((r) => r.name);
  const tables: Record<string, number> = {};
  for (const name of names)
    tables[name] = (db.prepare(`SELECT COUNT(*) AS n FROM "${name}"`).get() as { n: number }).n;
  const keys = db.prepare(`SELECT storageKey, proxyKey, posterKey, thumbnailsKey FROM clip`).all() as Record<
    string,
    string | null
  >[];
  const objects = [
    ...new Set(keys.flatMap((row) => Object.values(row).filter((k): k is string => Boolean(k)))),
  ].sort();
  const migrations = names.includes('migrations')
    ? (db.prepare(`SELECT name FROM migrations ORDER BY id`).all() as { name: string }[]).map((r) => r.name)
    : [];
  return { tables, objects, migrations };
}

/**
 * A consistent copy of the database while the app keeps running (SQLite's online backup API: writers
 * go on, the copy is of one moment), with a manifest of its tables and the object keys it refers to.
 */
export async function backupDatabase(
  databasePath: string,
  outDir: string,
  now = new Date(),
): Promise<string> {
  const dir = path.join(outDir, now.toISOString().replace(/[:.]/g, '-'));
  await fs.mkdir(dir, { recursive: true });
  const target = path.join(dir, DATABASE_FILE);
  const live = new Database(databasePath, { fileMustExist: true });
  try {
    await live.backup(target);
  } finally {
    live.close();
  }
  const copy = new Database(target, { readonly: true });
  let described;
  try {
    described = describe(copy);
  } finally {
    copy.close();
  }
  const manifest: BackupManifest = {
    createdAt: now.toISOString(),
    database: {
      file: DATABASE_FILE,
      sha256: await sha256(target),
      bytes: (await fs.stat(target)).size,
      migrations: described.migrations,
    },
    tables: described.tables,
    objects: described.objects,
  };
  await fs.writeFile(path.join(dir, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
  return dir;
}

export async function readManifest(backupDir: string): Promise<BackupManifest> {
  return JSON.parse(await fs.readFile(path.join(backupDir, MANIFEST_FILE), 'utf8')) as BackupManifest;
}

/**
 * Puts a backup back in place of the database: checks the copy against its manifest first, then
 * writes it over the live file through the same backup API (so a half-written restore cannot happen).
 * Stop the app before restoring: it keeps caches of what it read. Returns the manifest restored.
 */
export async function restoreDatabase(backupDir: string, databasePath: string): Promise<BackupManifest> {
  const manifest = await readManifest(backupDir);
  const source = path.join(backupDir, manifest.database.file);
  const actual = await sha256(source);
  if (actual !== manifest.database.sha256) {
    throw new Error(`the backup's database does not match its manifest (sha256 ${actual}); it is damaged`);
  }
  const copy = new Database(source, { readonly: true });
  try {
    await copy.backup(databasePath);
  } finally {
    copy.close();
  }
  return manifest;
}

/** Rows per table and object keys of a database as it is now, to compare with a manifest. */
export function describeDatabase(databasePath: string): Pick<BackupManifest, 'tables' | 'objects'> {
  const db = new Database(databasePath, { readonly: true });
  try {
    const { tables, objects } = describe(db);
    return { tables, objects };
  } finally {
    db.close();
  }
}
