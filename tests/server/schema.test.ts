import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { ALL_MIGRATIONS, openDatabase } from '@server/db/data-source';

let dir: string;
let dataSource: DataSource;

beforeAll(async () => {
  dir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-schema-'));
  dataSource = await openDatabase(path.join(dir, 'schema.sqlite'));
});
afterAll(async () => {
  await dataSource.destroy();
  await fs.rm(dir, { recursive: true, force: true });
});

describe('database schema', () => {
  it('is created by the migrations and matches the entities exactly (nothing left to synchronize)', async () => {
    const pending = await dataSource.driver.createSchemaBuilder().log();
    expect(pending.upQueries.map((q) => q.query)).toEqual([]);
    const ran = (await dataSource.query('SELECT name FROM migrations')) as { name: string }[];
    expect(ran.map((r) => r.name)).toEqual(ALL_MIGRATIONS.map((m) => new m().name));
  });

  it('has a table for every part of the domain', async () => {
    const rows = (await dataSource.query(
      "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name != 'migrations'",
    )) as { name: string }[];
    expect(rows.map((r) => r.name).sort()).toEqual(
      [
        'age_group',
        'athlete',
        'audit_event',
        'clip',
        'clip_athlete',
        'clip_turns',
        'club',
        'compare_still',
        'consent_event',
        'coach_assignment',
        'flag',
        'focus_point',
        'frame_result',
        'guardian_link',
        'invitation',
        'job',
        'note',
        'password_reset',
        'rate_limit_hit',
        'reference_line',
        'refresh_token',
        'review',
        'review_item',
        'review_receipt',
        'season',
        'season_baseline',
        'tolerance_band',
        'tolerance_band_change',
        'training_session',
        'user',
      ].sort(),
    );
  });

  it('runs in WAL mode with foreign keys enforced', async () => {
    expect(await dataSource.query('PRAGMA journal_mode')).toEqual([{ journal_mode: 'wal' }]);
    expect(await dataSource.query('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }]);
    await expect(
      dataSource.query(
        "INSERT INTO age_group (id, clubId, name, minAge, maxAge) VALUES ('a', 'no-such-club', 'U10', 8, 9)",
      ),
    ).rejects.toThrow(/FOREIGN KEY/);
  });

  it('migrates all the way down and up again cleanly', async () => {
    for (let i = 0; i < ALL_MIGRATIONS.length; i += 1) await dataSource.undoLastMigration();
    const left = (await dataSource.query(
      "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name != 'migrations'",
    )) as unknown[];
    expect(left).toEqual([]);
    await dataSource.runMigrations();
    expect((await dataSource.driver.createSchemaBuilder().log()).upQueries).toEqual([]);
  });
});
