import type { MigrationInterface, QueryRunner } from 'typeorm';

// Reviews as drafts that are published and withdrawn: the chosen notes, focus points and side-by-side
// stills in order, the overlays the athlete sees, an optional baseline to play beside the clip, and
// read receipts. The first schema's review table was never written to; it is rebuilt in its new shape.
export class Reviews1796290000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'Reviews1796290000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_review_athlete"`);
    await queryRunner.query(`DROP TABLE "review"`);
    await queryRunner.query(
      `CREATE TABLE "review" ("id" varchar(36) PRIMARY KEY NOT NULL, "clipId" varchar(36) NOT NULL, "athleteId" varchar(36) NOT NULL, "createdById" varchar(36), "title" varchar(120) NOT NULL, "summary" text NOT NULL DEFAULT (''), "publishedAt" datetime, "createdAt" datetime NOT NULL, "clubId" varchar(36) NOT NULL, "status" varchar(10) NOT NULL DEFAULT ('draft'), "overlays" text NOT NULL, "compareClipId" varchar(36), "showCurves" boolean NOT NULL DEFAULT (0), "withdrawnAt" datetime, "publishCount" integer NOT NULL DEFAULT (0), "updatedAt" datetime NOT NULL, CONSTRAINT "FK_7f1febb5465b721169034ec247f" FOREIGN KEY ("createdById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_9d2756648b938413eaa20c4f8ea" FOREIGN KEY ("athleteId") REFERENCES "athlete" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_20c527ebf3d322568586153a6c7" FOREIGN KEY ("clipId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_157afc7c12b6ea0e9f5b37ae186" FOREIGN KEY ("clubId") REFERENCES "club" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_7fa2e3cc93b1b8151349a79dcff" FOREIGN KEY ("compareClipId") REFERENCES "clip" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_review_athlete_status" ON "review" ("athleteId", "status") `);
    await queryRunner.query(`CREATE INDEX "IDX_review_clip" ON "review" ("clipId") `);
    await queryRunner.query(
      `CREATE TABLE "review_item" ("id" varchar(36) PRIMARY KEY NOT NULL, "reviewId" varchar(36) NOT NULL, "kind" varchar(12) NOT NULL, "refId" varchar(36) NOT NULL, "rank" integer NOT NULL, CONSTRAINT "UQ_review_item_ref" UNIQUE ("reviewId", "kind", "refId"), CONSTRAINT "FK_b6cf57be0e2f6de237ba203af2a" FOREIGN KEY ("reviewId") REFERENCES "review" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE TABLE "review_receipt" ("id" varchar(36) PRIMARY KEY NOT NULL, "reviewId" varchar(36) NOT NULL, "userId" varchar(36) NOT NULL, "firstOpenedAt" datetime NOT NULL, "lastOpenedAt" datetime NOT NULL, "opens" integer NOT NULL DEFAULT (1), CONSTRAINT "UQ_review_receipt_user" UNIQUE ("reviewId", "userId"), CONSTRAINT "FK_d7aa3324362e4cdeace9f6abcc4" FOREIGN KEY ("reviewId") REFERENCES "review" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_d72a37a1145047398948bdbc61d" FOREIGN KEY ("userId") REFERENCES "user" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "review_receipt"`);
    await queryRunner.query(`DROP TABLE "review_item"`);
    await queryRunner.query(`DROP INDEX "IDX_review_clip"`);
    await queryRunner.query(`DROP INDEX "IDX_review_athlete_status"`);
    await queryRunner.query(`DROP TABLE "review"`);
    await queryRunner.query(
      `CREATE TABLE "review" ("id" varchar(36) PRIMARY KEY NOT NULL, "clipId" varchar(36) NOT NULL, "athleteId" varchar(36) NOT NULL, "createdById" varchar(36), "title" varchar(200) NOT NULL, "summary" text, "publishedAt" datetime, "shareTokenHash" varchar(64), "createdAt" datetime NOT NULL, CONSTRAINT "UQ_8264c5240f60418b2e1c62954bc" UNIQUE ("shareTokenHash"), CONSTRAINT "FK_20c527ebf3d322568586153a6c7" FOREIGN KEY ("clipId") REFERENCES "clip" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_9d2756648b938413eaa20c4f8ea" FOREIGN KEY ("athleteId") REFERENCES "athlete" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_7f1febb5465b721169034ec247f" FOREIGN KEY ("createdById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_review_athlete" ON "review" ("athleteId")`);
  }
}
