import type { MigrationInterface, QueryRunner } from 'typeorm';

// The playable copy's byte size, so media Range answers need no round trip to the store.
export class ClipProxySize1796250000001 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'ClipProxySize1796250000001';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "clip" ADD COLUMN "proxySizeBytes" integer`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "clip" DROP COLUMN "proxySizeBytes"`);
  }
}
