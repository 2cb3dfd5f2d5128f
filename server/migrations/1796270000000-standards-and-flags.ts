import type { MigrationInterface, QueryRunner } from 'typeorm';

// Bands that coaches edit, with every change kept; flags as coaching points (one per habit and turn, with
// a review state) instead of one row per frame; turns kept per clip; durable background jobs. The old
// per-frame flags cannot be turned into groups here (that needs the turns), so they are dropped and a
// re-evaluation job per club rebuilds them at the next start.
export class StandardsAndFlags1796270000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'StandardsAndFlags1796270000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "tolerance_band" ADD COLUMN "version" integer NOT NULL DEFAULT (1)`);
    await queryRunner.query(
      `CREATE TABLE "tolerance_band_change" ("id" varchar(36) PRIMARY KEY NOT NULL, "clubId" varchar(36) NOT NULL, "ageGroupId" varchar(36) NOT NULL, "metric" varchar(60) NOT NULL, "version" integer NOT NULL, "action" varchar(10) NOT NULL, "before" text, "after" text NOT NULL, "changedById" varchar(36), "changedAt" datetime NOT NULL, CONSTRAINT "FK_e26a40a98a51d7f430b51e15c65" FOREIGN KEY ("clubId") REFERENCES "club" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_067a1e4c8e534c946f436781d65" FOREIGN KEY ("ageGroupId") REFERENCES "age_group" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_da9f331ce921c52bb34d3ef2726" FOREIGN KEY ("changedById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_tolerance_band_change_club_time" ON "tolerance_band_change" ("clubId", "changedAt") `,
    );
    await queryRunner.query(
      `CREATE TABLE "job" ("id" varchar(36) PRIMARY KEY NOT NULL, "kind" varchar(30) NOT NULL, "clubId" varchar(36), "payload" text NOT NULL, "label" varchar(200) NOT NULL, "status" varchar(10) NOT NULL, "total" integer NOT NULL DEFAULT (0), "done" integer NOT NULL DEFAULT (0), "cursor" varchar(80), "error" text, "createdById" varchar(36), "createdAt" datetime NOT NULL, "startedAt" datetime, "finishedAt" datetime, "updatedAt" datetime NOT NULL, CONSTRAINT "FK_3458ae010294c08e8ab4cf7565a" FOREIGN KEY ("clubId") REFERENCES "club" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_228b150b2333ecd5dbf4f7fc1fa" FOREIGN KEY ("createdById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_job_status" ON "job" ("status", "createdAt") `);
    await queryRunner.query(
      `CREATE TABLE "clip_turns" ("id" varchar(36) PRIMARY KEY NOT NULL, "clipId" varchar(36) NOT NULL, "model" varchar(20) NOT NULL, "turns" text NOT NULL, "maxGapFrames" integer NOT NULL, "updatedAt" datetime NOT NULL, CONSTRAINT "UQ_clip_turns_clip_model" UNIQUE ("clipId", "model"), CONSTRAINT "FK_1062cf5a05bb610b2265f8fd46d" FOREIGN KEY ("clipId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`DROP TABLE "flag"`);
    await queryRunner.query(
      `CREATE TABLE "flag" ("id" varchar(36) PRIMARY KEY NOT NULL, "clipId" varchar(36) NOT NULL, "toleranceBandId" varchar(36), "frameIndex" integer NOT NULL, "metric" varchar(60) NOT NULL, "value" real NOT NULL, "severity" varchar(10) NOT NULL, "createdAt" datetime NOT NULL, "model" varchar(20) NOT NULL DEFAULT ('lightning'), "turnIndex" integer, "bandMin" real, "bandMax" real, "distance" real NOT NULL DEFAULT (0), "groupKey" varchar(20) NOT NULL, "firstFrame" integer NOT NULL, "lastFrame" integer NOT NULL, "frameCount" integer NOT NULL, "bandVersion" integer NOT NULL DEFAULT (1), "athleteId" varchar(36), "ageGroupId" varchar(36), "status" varchar(12) NOT NULL DEFAULT ('unreviewed'), "statusComment" text, "statusById" varchar(36), "statusAt" datetime, "updatedAt" datetime NOT NULL, CONSTRAINT "UQ_flag_clip_model_metric_group" UNIQUE ("clipId", "model", "metric", "groupKey"), CONSTRAINT "FK_da6b5d715f92b50fa39531a97fa" FOREIGN KEY ("toleranceBandId") REFERENCES "tolerance_band" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_2e7897ca81c4bbf89632f65db6b" FOREIGN KEY ("clipId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_36fdc9424c6e5f152375f52c831" FOREIGN KEY ("athleteId") REFERENCES "athlete" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_461714ccf4d69204073413da6eb" FOREIGN KEY ("ageGroupId") REFERENCES "age_group" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_4eb0b15b6246012643f8e072281" FOREIGN KEY ("statusById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_flag_clip_model" ON "flag" ("clipId", "model") `);
    await queryRunner.query(`CREATE INDEX "IDX_flag_inbox" ON "flag" ("ageGroupId", "status", "createdAt") `);
    await queryRunner.query(`CREATE INDEX "IDX_flag_athlete" ON "flag" ("athleteId", "createdAt") `);
    await queryRunner.query(
      `INSERT INTO "job" ("id", "kind", "clubId", "payload", "label", "status", "total", "done", "createdAt", "updatedAt")
       SELECT lower(hex(randomblob(16))), 'flag-reevaluation', "id", '{"ageGroupIds":null}',
              'Flags rebuilt as one per habit and turn', 'queued', 0, 0, datetime('now'), datetime('now') FROM "club"`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "flag"`);
    await queryRunner.query(
      `CREATE TABLE "flag" ("id" varchar(36) PRIMARY KEY NOT NULL, "clipId" varchar(36) NOT NULL, "frameResultId" varchar(36), "toleranceBandId" varchar(36), "frameIndex" integer NOT NULL, "metric" varchar(60) NOT NULL, "value" real NOT NULL, "severity" varchar(10) NOT NULL, "createdAt" datetime NOT NULL, "model" varchar(20) NOT NULL DEFAULT ('lightning'), "turnIndex" integer, "bandMin" real, "bandMax" real, "distance" real NOT NULL DEFAULT (0), CONSTRAINT "FK_da6b5d715f92b50fa39531a97fa" FOREIGN KEY ("toleranceBandId") REFERENCES "tolerance_band" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_2e7897ca81c4bbf89632f65db6b" FOREIGN KEY ("clipId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_flag_clip_model" ON "flag" ("clipId", "model") `);
    await queryRunner.query(`CREATE INDEX "IDX_flag_clip_frame" ON "flag" ("clipId", "frameIndex") `);
    await queryRunner.query(`DROP TABLE "clip_turns"`);
    await queryRunner.query(`DROP TABLE "job"`);
    await queryRunner.query(`DROP TABLE "tolerance_band_change"`);
    await queryRunner.query(`ALTER TABLE "tolerance_band" DROP COLUMN "version"`);
  }
}
