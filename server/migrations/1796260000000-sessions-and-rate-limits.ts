import type { MigrationInterface, QueryRunner } from 'typeorm';

// Refresh tokens name the sign-in session they belong to (access and media tokens carry it, so ending
// the session ends them), and login attempts are counted in the database, shared by every process.
export class SessionsAndRateLimits1796260000000 implements MigrationInterface {
  // Explicit name: minifiers rename classes, and TypeORM records migrations by name.
  name = 'SessionsAndRateLimits1796260000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE "rate_limit_hit" ("key" varchar(400) PRIMARY KEY NOT NULL, "hits" integer NOT NULL, "resetAt" datetime NOT NULL)`,
    );
    await queryRunner.query(`DROP INDEX "IDX_refresh_token_user"`);
    await queryRunner.query(
      `CREATE TABLE "temporary_refresh_token" ("id" varchar(36) PRIMARY KEY NOT NULL, "userId" varchar(36) NOT NULL, "tokenHash" varchar(64) NOT NULL, "expiresAt" datetime NOT NULL, "revokedAt" datetime, "createdAt" datetime NOT NULL, "sessionId" varchar(36) NOT NULL, CONSTRAINT "UQ_204f27bcee2b705b8230beaf414" UNIQUE ("tokenHash"), CONSTRAINT "FK_8e913e288156c133999341156ad" FOREIGN KEY ("userId") REFERENCES "user" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    // Tokens issued before sessions existed each become a session of their own.
    await queryRunner.query(
      `INSERT INTO "temporary_refresh_token"("id", "userId", "tokenHash", "expiresAt", "revokedAt", "createdAt", "sessionId") SELECT "id", "userId", "tokenHash", "expiresAt", "revokedAt", "createdAt", "id" FROM "refresh_token"`,
    );
    await queryRunner.query(`DROP TABLE "refresh_token"`);
    await queryRunner.query(`ALTER TABLE "temporary_refresh_token" RENAME TO "refresh_token"`);
    await queryRunner.query(`CREATE INDEX "IDX_refresh_token_user" ON "refresh_token" ("userId") `);
    await queryRunner.query(`CREATE INDEX "IDX_refresh_token_session" ON "refresh_token" ("sessionId") `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "IDX_refresh_token_session"`);
    await queryRunner.query(`DROP INDEX "IDX_refresh_token_user"`);
    await queryRunner.query(`ALTER TABLE "refresh_token" RENAME TO "temporary_refresh_token"`);
    await queryRunner.query(
      `CREATE TABLE "refresh_token" ("id" varchar(36) PRIMARY KEY NOT NULL, "userId" varchar(36) NOT NULL, "tokenHash" varchar(64) NOT NULL, "expiresAt" datetime NOT NULL, "revokedAt" datetime, "createdAt" datetime NOT NULL, CONSTRAINT "UQ_204f27bcee2b705b8230beaf414" UNIQUE ("tokenHash"), CONSTRAINT "FK_8e913e288156c133999341156ad" FOREIGN KEY ("userId") REFERENCES "user" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await queryRunner.query(
      `INSERT INTO "refresh_token"("id", "userId", "tokenHash", "expiresAt", "revokedAt", "createdAt") SELECT "id", "userId", "tokenHash", "expiresAt", "revokedAt", "createdAt" FROM "temporary_refresh_token"`,
    );
    await queryRunner.query(`DROP TABLE "temporary_refresh_token"`);
    await queryRunner.query(`CREATE INDEX "IDX_refresh_token_user" ON "refresh_token" ("userId") `);
    await queryRunner.query(`DROP TABLE "rate_limit_hit"`);
  }
}
