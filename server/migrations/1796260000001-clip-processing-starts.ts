import type { MigrationInterface, QueryRunner } from 'typeorm';

// How often processing of a clip began without ending (a crash mid-encode): a clip is resumed once
// after a crash, and a second interruption fails it with a reason instead of crashing the server again.
export class ClipProcessingStarts1796260000001 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'ClipProcessingStarts1796260000001';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "clip" ADD COLUMN "processingStarts" integer NOT NULL DEFAULT (0)`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "clip" DROP COLUMN "processingStarts"`);
  }
}
