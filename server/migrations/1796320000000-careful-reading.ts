import type { MigrationInterface, QueryRunner } from 'typeorm';

// A frame read carefully (the frame and its mirror image, averaged: docs/accuracy.md) says so, so the
// clip page and the export can tell the coach how its points were read.
export class CarefulReading1796320000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'CarefulReading1796320000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "frame_result" ADD COLUMN "careful" boolean NOT NULL DEFAULT (0)`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "frame_result" DROP COLUMN "careful"`);
  }
}
