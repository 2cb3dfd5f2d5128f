import type { MigrationInterface, QueryRunner } from 'typeorm';

// Server-side analysis of a clip is a durable job too: the job table gets the clip it reads, with a
// foreign key so that erasing the clip removes its jobs. SQLite adds a foreign key only by rebuilding
// the table (the job table is small: one row per band change or clip analysed).
const COLUMNS = `"id", "kind", "clubId", "payload", "label", "status", "total", "done", "cursor", "error", "createdById", "createdAt", "startedAt", "finishedAt", "updatedAt"`;
const BASE = `"id" varchar(36) PRIMARY KEY NOT NULL, "kind" varchar(30) NOT NULL, "clubId" varchar(36), "payload" text NOT NULL, "label" varchar(200) NOT NULL, "status" varchar(10) NOT NULL, "total" integer NOT NULL DEFAULT (0), "done" integer NOT NULL DEFAULT (0), "cursor" varchar(80), "error" text, "createdById" varchar(36), "createdAt" datetime NOT NULL, "startedAt" datetime, "finishedAt" datetime, "updatedAt" datetime NOT NULL`;
const USER_FK = `CONSTRAINT "FK_228b150b2333ecd5dbf4f7fc1fa" FOREIGN KEY ("createdById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION`;
const CLUB_FK = `CONSTRAINT "FK_3458ae010294c08e8ab4cf7565a" FOREIGN KEY ("clubId") REFERENCES "club" ("id") ON DELETE CASCADE ON UPDATE NO ACTION`;
const CLIP_FK = `CONSTRAINT "FK_eb3f952d5a7544d940bad7558a7" FOREIGN KEY ("clipId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION`;

export class ClipAnalysisJobs1796310000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'ClipAnalysisJobs1796310000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_job_status"`);
    await queryRunner.query(
      `CREATE TABLE "temporary_job" (${BASE}, "clipId" varchar(36), ${USER_FK}, ${CLUB_FK}, ${CLIP_FK})`,
    );
    await queryRunner.query(`INSERT INTO "temporary_job"(${COLUMNS}) SELECT ${COLUMNS} FROM "job"`);
    await queryRunner.query(`DROP TABLE "job"`);
    await queryRunner.query(`ALTER TABLE "temporary_job" RENAME TO "job"`);
    await queryRunner.query(`CREATE INDEX "IDX_job_status" ON "job" ("status", "createdAt") `);
    await queryRunner.query(`CREATE INDEX "IDX_job_clip" ON "job" ("clipId", "createdAt") `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_job_clip"`);
    await queryRunner.query(`DROP INDEX "IDX_job_status"`);
    await queryRunner.query(`DELETE FROM "job" WHERE "kind" = 'clip-analysis'`);
    await queryRunner.query(`CREATE TABLE "temporary_job" (${BASE}, ${USER_FK}, ${CLUB_FK})`);
    await queryRunner.query(`INSERT INTO "temporary_job"(${COLUMNS}) SELECT ${COLUMNS} FROM "job"`);
    await queryRunner.query(`DROP TABLE "job"`);
    await queryRunner.query(`ALTER TABLE "temporary_job" RENAME TO "job"`);
    await queryRunner.query(`CREATE INDEX "IDX_job_status" ON "job" ("status", "createdAt") `);
  }
}
