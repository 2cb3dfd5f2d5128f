import type { MigrationInterface, QueryRunner } from 'typeorm';

// The clip list's analysis summary (frames and latest change per model) read from an index instead of
// the wide keypoint rows: with tens of thousands of stored frames it was the slowest read of the API.
export class FrameResultSummaryIndex1796260000003 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'FrameResultSummaryIndex1796260000003';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE INDEX "IDX_frame_result_clip_model_updated" ON "frame_result" ("clipId", "model", "updatedAt") `,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_frame_result_clip_model_updated"`);
  }
}
