import type { MigrationInterface, QueryRunner } from 'typeorm';

// Password-reset links sent by e-mail: the hash of each link's secret, its expiry and when it was used.
export class PasswordReset1796260000002 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'PasswordReset1796260000002';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "password_reset" ("id" varchar(36) PRIMARY KEY NOT NULL, "userId" varchar(36) NOT NULL, "tokenHash" varchar(64) NOT NULL, "expiresAt" datetime NOT NULL, "usedAt" datetime, "createdAt" datetime NOT NULL, CONSTRAINT "UQ_dc6908de54eb09f588adfdb2858" UNIQUE ("tokenHash"), CONSTRAINT "FK_05baebe80e9f8fab8207eda250c" FOREIGN KEY ("userId") REFERENCES "user" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(`CREATE INDEX "IDX_password_reset_user" ON "password_reset" ("userId") `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_password_reset_user"`);
    await queryRunner.query(`DROP TABLE "password_reset"`);
  }
}
