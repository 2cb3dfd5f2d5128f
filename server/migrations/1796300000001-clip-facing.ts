import type { MigrationInterface, QueryRunner } from 'typeorm';

// Front-view clips filmed from behind: the clip says which way the skier faces, and the keypoints of
// a clip filmed from behind are stored with left and right swapped back to the skier's own. And the
// athlete the coach picked when several people are in the frame.
export class ClipFacing1796300000001 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'ClipFacing1796300000001';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "clip" ADD COLUMN "facing" varchar(6) NOT NULL DEFAULT ('toward')`);
    await queryRunner.query(`ALTER TABLE "clip" ADD COLUMN "athletePick" text`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "clip" DROP COLUMN "athletePick"`);
    await queryRunner.query(`ALTER TABLE "clip" DROP COLUMN "facing"`);
  }
}
