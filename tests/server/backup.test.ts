import { execFile } from 'node:child_process';
import fs from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backupDatabase, describeDatabase, readManifest, restoreDatabase } from '@server/maintenance/backup';
import { createTestServer, type TestServer } from '../helpers/server-harness';

const run = promisify(execFile);
let server: TestServer;

beforeAll(async () => {
  server = await createTestServer();
});
afterAll(async () => {
  await server.close();
});

async function snapshot() {
  const athletes = await server.runtime.dataSource.query(
    'SELECT id, firstName, lastName, ageGroupId FROM athlete ORDER BY id',
  );
  const sessions = await server.runtime.dataSource.query(
    'SELECT id, venue, date FROM training_session ORDER BY id',
  );
  return { athletes, sessions, counts: describeDatabase(server.config.databasePath).tables };
}

describe('backup and restore', () => {
  it('copies the database while the app runs, and a restore brings back exactly that copy', async () => {
    const before = await snapshot();
    const dir = await backupDatabase(server.config.databasePath, path.join(server.dataDir, 'backups'));
    const manifest = await readManifest(dir);
    expect(manifest.tables).toEqual(before.counts);
    expect(manifest.database.migrations.length).toBeGreaterThan(3);

    // The app keeps working after the backup: a new athlete, a renamed one, a removed session.
    const auth = await server.bearer('head');
    const created = await server.http
      .post('/api/athletes')
      .set(auth)
      .send({
        firstName: 'Tove',
        lastName: 'Aftercopy',
        birthYear: 2013,
        ageGroupId: await server.ageGroupId('U14'),
      });
    expect(created.status).toBe(201);
    await server.runtime.dataSource.query(
      `UPDATE athlete SET lastName = 'Changed' WHERE firstName = 'Elsie'`,
    );
    const changed = await snapshot();
    expect(changed).not.toEqual(before);

    const restored = await restoreDatabase(dir, server.config.databasePath);
    expect(restored.createdAt).toBe(manifest.createdAt);
    expect(await snapshot()).toEqual(before);
    // The app reads the restored data (a restart is advised; reads are not cached). The sign-in made
    // after the backup is gone with it: a new one is needed.
    expect((await server.http.get('/api/athletes').set(auth)).status).toBe(401);
    const again = await server.login('head');
    const list = await server.http.get('/api/athletes').set({ Authorization: `Bearer ${again.accessToken}` });
    expect(list.body.athletes.some((a: { lastName: string }) => a.lastName === 'Aftercopy')).toBe(false);
  });

  it('refuses a backup whose database no longer matches its manifest', async () => {
    const dir = await backupDatabase(
      server.config.databasePath,
      path.join(server.dataDir, 'backups'),
      new Date(0),
    );
    await fs.appendFile(path.join(dir, 'stanceline.sqlite'), 'damage');
    await expect(restoreDatabase(dir, server.config.databasePath)).rejects.toThrow(/damaged/);
  });

  it('runs as npm run backup with the README settings', async () => {
    const out = path.join(server.dataDir, 'cli-backups');
    const { stdout } = await run(
      process.execPath,
      ['--import', 'tsx', 'server/cli/backup.ts', '--out', out],
      {
        env: { ...process.env, DATA_DIR: server.dataDir, DATABASE_PATH: server.config.databasePath },
      },
    );
    expect(stdout).toMatch(/Backup written to/);
    const [folder] = await fs.readdir(out);
    expect((await readManifest(path.join(out, folder))).tables.athlete).toBeGreaterThan(0);
  });
});
