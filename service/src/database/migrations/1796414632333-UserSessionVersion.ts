import { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A session version per person, carried in every access token (claim sv) and compared on every request and socket
 * event: raised on sign-out-everywhere, a password change, a role change and deactivation, it ends every session at once.
 */
export class UserSessionVersion1796414632333 implements MigrationInterface {
  name = 'UserSessionVersion1796414632333';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "users" ADD "session_version" integer NOT NULL DEFAULT 1`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "users" DROP COLUMN "session_version"`);
  }
}
