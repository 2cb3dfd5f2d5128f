import type { MigrationInterface, QueryRunner } from 'typeorm';

// Media pipeline, stored analysis and tolerance-band fields. Columns are added in place
// (ALTER TABLE ... ADD COLUMN): rebuilding a parent table such as "clip" would, with foreign keys
// on, cascade-delete its children. DDL as TypeORM's SQLite schema builder emits it for the entities.
const ADDED: { table: string; column: string; definition: string }[] = [
  { table: 'clip', column: 'thumbnailsKey', definition: 'varchar(255)' },
  { table: 'clip', column: 'thumbnails', definition: 'text' },
  { table: 'clip', column: 'rotation', definition: 'integer NOT NULL DEFAULT (0)' },
  { table: 'clip', column: 'defaultModel', definition: `varchar(20) NOT NULL DEFAULT ('lightning')` },
  { table: 'frame_result', column: 'reasons', definition: `text NOT NULL DEFAULT ('{}')` },
  { table: 'tolerance_band', column: 'target', definition: 'real' },
  {
    table: 'tolerance_band',
    column: 'source',
    definition: `varchar(20) NOT NULL DEFAULT ('common practice')`,
  },
  { table: 'flag', column: 'model', definition: `varchar(20) NOT NULL DEFAULT ('lightning')` },
  { table: 'flag', column: 'turnIndex', definition: 'integer' },
  { table: 'flag', column: 'bandMin', definition: 'real' },
  { table: 'flag', column: 'bandMax', definition: 'real' },
  { table: 'flag', column: 'distance', definition: 'real NOT NULL DEFAULT (0)' },
];

const INDICES = [
  { name: 'IDX_clip_status', sql: `CREATE INDEX "IDX_clip_status" ON "clip" ("status")` },
  { name: 'IDX_flag_clip_model', sql: `CREATE INDEX "IDX_flag_clip_model" ON "flag" ("clipId", "model")` },
];

export class ClipWorkspace1796250000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'ClipWorkspace1796250000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    for (const { table, column, definition } of ADDED) {
      await queryRunner.query(`ALTER TABLE "${table}" ADD COLUMN "${column}" ${definition}`);
    }
    for (const index of INDICES) await queryRunner.query(index.sql);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    for (const index of [...INDICES].reverse()) await queryRunner.query(`DROP INDEX "${index.name}"`);
    // SQLite 3.35+ drops columns in place; none of these is part of an index or constraint.
    for (const { table, column } of [...ADDED].reverse()) {
      await queryRunner.query(`ALTER TABLE "${table}" DROP COLUMN "${column}"`);
    }
  }
}
