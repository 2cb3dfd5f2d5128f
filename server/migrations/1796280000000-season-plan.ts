import type { MigrationInterface, QueryRunner } from 'typeorm';

// Seasons of a club, an athlete's season plan (focus points with a phase, a target range or direction,
// a status and the coach's cue), one baseline clip per athlete and season, and side-by-side stills kept
// with a clip pair. The first schema's focus_point table was never written to; it is rebuilt in its new
// shape.
export class SeasonPlan1796280000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'SeasonPlan1796280000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "season" ("id" varchar(36) PRIMARY KEY NOT NULL, "clubId" varchar(36) NOT NULL, "name" varchar(40) NOT NULL, "startsOn" varchar(10) NOT NULL, "endsOn" varchar(10) NOT NULL, "createdAt" datetime NOT NULL, CONSTRAINT "UQ_season_club_name" UNIQUE ("clubId", "name"), CONSTRAINT "FK_ffd3ef7955bbd7fc935be5230e3" FOREIGN KEY ("clubId") REFERENCES "club" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`DROP INDEX "IDX_focus_point_athlete_rank"`);
    await queryRunner.query(`DROP TABLE "focus_point"`);
    await queryRunner.query(
      `CREATE TABLE "focus_point" ("id" varchar(36) PRIMARY KEY NOT NULL, "athleteId" varchar(36) NOT NULL, "createdById" varchar(36), "rank" integer NOT NULL, "title" varchar(120) NOT NULL, "metric" varchar(60), "targetMin" real, "targetMax" real, "status" varchar(12) NOT NULL DEFAULT ('planned'), "createdAt" datetime NOT NULL, "seasonId" varchar(36) NOT NULL, "cue" text NOT NULL DEFAULT (''), "phase" varchar(12), "direction" varchar(10), "updatedAt" datetime NOT NULL, CONSTRAINT "FK_cd92120f33fd7bb41d66a3cdf67" FOREIGN KEY ("createdById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_99f1ca2a8dfc92f901ba2442eb2" FOREIGN KEY ("athleteId") REFERENCES "athlete" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_9efc6386ba49f188238c414b381" FOREIGN KEY ("seasonId") REFERENCES "season" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_focus_point_plan" ON "focus_point" ("athleteId", "seasonId", "rank") `,
    );
    await queryRunner.query(
      `CREATE TABLE "season_baseline" ("id" varchar(36) PRIMARY KEY NOT NULL, "athleteId" varchar(36) NOT NULL, "seasonId" varchar(36) NOT NULL, "clipId" varchar(36) NOT NULL, "setById" varchar(36), "setAt" datetime NOT NULL, CONSTRAINT "UQ_season_baseline_athlete_season" UNIQUE ("athleteId", "seasonId"), CONSTRAINT "FK_1f2941a25b0f9f7005d59bf81f4" FOREIGN KEY ("athleteId") REFERENCES "athlete" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_cf172778420dfcd2f23e02f8949" FOREIGN KEY ("seasonId") REFERENCES "season" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_68b69036bb402fb51c129241f8e" FOREIGN KEY ("clipId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_f2e3f95bd5f03be3545e8edffe5" FOREIGN KEY ("setById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE TABLE "compare_still" ("id" varchar(36) PRIMARY KEY NOT NULL, "clubId" varchar(36) NOT NULL, "clipAId" varchar(36) NOT NULL, "clipBId" varchar(36) NOT NULL, "frameA" integer NOT NULL, "frameB" integer NOT NULL, "caption" varchar(200) NOT NULL DEFAULT (''), "storageKey" varchar(200) NOT NULL, "byteSize" integer NOT NULL, "createdById" varchar(36), "createdAt" datetime NOT NULL, CONSTRAINT "FK_c395b8ee077d604f1a47f44b8b1" FOREIGN KEY ("clubId") REFERENCES "club" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_b5fc071a5f391f48a1437ad723d" FOREIGN KEY ("clipAId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_fc7b358c95d4f77bb54c054f203" FOREIGN KEY ("clipBId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_5b02fb7d4d77604002b35752284" FOREIGN KEY ("createdById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_compare_still_pair" ON "compare_still" ("clipAId", "clipBId", "createdAt") `,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_compare_still_pair"`);
    await queryRunner.query(`DROP TABLE "compare_still"`);
    await queryRunner.query(`DROP TABLE "season_baseline"`);
    await queryRunner.query(`DROP INDEX "IDX_focus_point_plan"`);
    await queryRunner.query(`DROP TABLE "focus_point"`);
    await queryRunner.query(
      `CREATE TABLE "focus_point" ("id" varchar(36) PRIMARY KEY NOT NULL, "athleteId" varchar(36) NOT NULL, "createdById" varchar(36), "rank" integer NOT NULL, "title" varchar(200) NOT NULL, "metric" varchar(60), "targetMin" real, "targetMax" real, "baselineClipId" varchar(36), "status" varchar(12) NOT NULL DEFAULT ('active'), "createdAt" datetime NOT NULL, CONSTRAINT "FK_99f1ca2a8dfc92f901ba2442eb2" FOREIGN KEY ("athleteId") REFERENCES "athlete" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_cd92120f33fd7bb41d66a3cdf67" FOREIGN KEY ("createdById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_f20d59026e571c17e083a24bd48" FOREIGN KEY ("baselineClipId") REFERENCES "clip" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_focus_point_athlete_rank" ON "focus_point" ("athleteId", "rank")`,
    );
    await queryRunner.query(`DROP TABLE "season"`);
  }
}
