import { randomUUID } from 'node:crypto';

/** What copying rows needs of a data source or a transaction's manager. */
interface Queryable {
  query(sql: string, parameters?: unknown[]): Promise<unknown>;
}

/**
 * Copies the row `id` of `table` inside SQLite, with `overrides` (column → value) in place of its own
 * values: a fast way to build large or odd fixtures (many clips, a second club) for tests and benchmarks.
 */
export async function copyRow(
  db: Queryable,
  table: string,
  id: string,
  overrides: Record<string, string>,
): Promise<void> {
  const columns = ((await db.query(`PRAGMA table_info(${table})`)) as { name: string }[]).map((c) => c.name);
  const values = columns.map((c) => (c in overrides ? '?' : `"${c}"`)).join(', ');
  const params = columns.filter((c) => c in overrides).map((c) => overrides[c]);
  await db.query(
    `INSERT INTO ${table} (${columns.map((c) => `"${c}"`).join(', ')}) SELECT ${values} FROM ${table} WHERE id = ?`,
    [...params, id],
  );
}

/** A copy of a clip tagged with `athleteId`, with a copy of its stored frames when `withFrames`. */
export async function copyClip(
  db: Queryable,
  templateId: string,
  athleteId: string,
  withFrames: boolean,
): Promise<string> {
  const id = randomUUID();
  await copyRow(db, 'clip', templateId, { id });
  await db.query('INSERT INTO clip_athlete ("clipId", "athleteId") VALUES (?, ?)', [id, athleteId]);
  if (withFrames) {
    const columns = ((await db.query('PRAGMA table_info(frame_result)')) as { name: string }[]).map(
      (c) => c.name,
    );
    const select = columns
      .map((c) => (c === 'id' ? 'lower(hex(randomblob(16)))' : c === 'clipId' ? '?' : `"${c}"`))
      .join(', ');
    await db.query(
      `INSERT INTO frame_result (${columns.map((c) => `"${c}"`).join(', ')}) SELECT ${select} FROM frame_result WHERE "clipId" = ?`,
      [id, templateId],
    );
  }
  return id;
}
