import type { MigrationInterface, QueryRunner } from 'typeorm';

// The consent life cycle: a record of who gave, withdrew and restored consent for what; withdrawal with
// an erasure date; a second purpose (reviews by e-mail); the club's grace period and retention after a
// season; the retention notice per season; adult athletes keeping a guardian's access. New columns are
// added in place (no table rebuild: dropping a parent table would run its children's cascades).
export class ConsentLifecycle1796300000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'ConsentLifecycle1796300000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "consent_event" ("id" varchar(36) PRIMARY KEY NOT NULL, "athleteId" varchar(36) NOT NULL, "action" varchar(20) NOT NULL, "purposes" text NOT NULL, "decidedBy" varchar(120) NOT NULL, "method" varchar(20), "recordedById" varchar(36), "recordedByRole" varchar(12) NOT NULL, "at" datetime NOT NULL, CONSTRAINT "FK_d5f0b9985e8a4071591c1717068" FOREIGN KEY ("athleteId") REFERENCES "athlete" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_8d1ba682be7c79d13d1f8e9d792" FOREIGN KEY ("recordedById") REFERENCES "user" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `CREATE INDEX "IDX_consent_event_athlete" ON "consent_event" ("athleteId", "at") `,
    );
    await queryRunner.query(`ALTER TABLE "club" ADD COLUMN "consentGraceDays" integer NOT NULL DEFAULT (30)`);
    await queryRunner.query(`ALTER TABLE "club" ADD COLUMN "retentionDaysAfterSeason" integer DEFAULT (365)`);
    await queryRunner.query(
      `ALTER TABLE "athlete" ADD COLUMN "consentShareByEmail" boolean NOT NULL DEFAULT (0)`,
    );
    await queryRunner.query(`ALTER TABLE "athlete" ADD COLUMN "consentWithdrawnAt" datetime`);
    await queryRunner.query(`ALTER TABLE "athlete" ADD COLUMN "erasureDueAt" datetime`);
    await queryRunner.query(`CREATE INDEX "IDX_athlete_erasure_due" ON "athlete" ("erasureDueAt") `);
    await queryRunner.query(`ALTER TABLE "guardian_link" ADD COLUMN "keptByAthleteAt" datetime`);
    await queryRunner.query(`ALTER TABLE "season" ADD COLUMN "retentionNoticeSentAt" datetime`);
    // Consent recorded before this release covered storing clips; it becomes the first entry of the record.
    await queryRunner.query(
      `INSERT INTO "consent_event" ("id", "athleteId", "action", "purposes", "decidedBy", "method", "recordedById", "recordedByRole", "at")
       SELECT lower(hex(randomblob(4))) || '-' || lower(hex(randomblob(2))) || '-4' || substr(lower(hex(randomblob(2))), 2) || '-a' || substr(lower(hex(randomblob(2))), 2) || '-' || lower(hex(randomblob(6))),
              "id", 'given', '["store_clips"]', COALESCE("consentGuardianName", 'a guardian'), "consentMethod", "consentRecordedById", 'coach', "consentRecordedAt"
       FROM "athlete" WHERE "consentRecordedAt" IS NOT NULL`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "season" DROP COLUMN "retentionNoticeSentAt"`);
    await queryRunner.query(`ALTER TABLE "guardian_link" DROP COLUMN "keptByAthleteAt"`);
    await queryRunner.query(`DROP INDEX "IDX_athlete_erasure_due"`);
    await queryRunner.query(`ALTER TABLE "athlete" DROP COLUMN "erasureDueAt"`);
    await queryRunner.query(`ALTER TABLE "athlete" DROP COLUMN "consentWithdrawnAt"`);
    await queryRunner.query(`ALTER TABLE "athlete" DROP COLUMN "consentShareByEmail"`);
    await queryRunner.query(`ALTER TABLE "club" DROP COLUMN "retentionDaysAfterSeason"`);
    await queryRunner.query(`ALTER TABLE "club" DROP COLUMN "consentGraceDays"`);
    await queryRunner.query(`DROP INDEX "IDX_consent_event_athlete"`);
    await queryRunner.query(`DROP TABLE "consent_event"`);
  }
}
