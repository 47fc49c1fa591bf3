import { MigrationInterface, QueryRunner } from "typeorm";

export class SignInWaitsAndSessionStamps1796412951142 implements MigrationInterface {
    name = 'SignInWaitsAndSessionStamps1796412951142'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`sign_in_throttles\` (\`email_hash\` char(64) NOT NULL, \`failures\` int UNSIGNED NOT NULL DEFAULT '0', \`last_failure_at\` datetime(3) NULL, \`wait_until\` datetime(3) NULL, \`unlock_sent_at\` datetime(3) NULL, PRIMARY KEY (\`email_hash\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`users\` ADD \`session_epoch\` int UNSIGNED NOT NULL DEFAULT '0'`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`users\` DROP COLUMN \`session_epoch\``);
        await queryRunner.query(`DROP TABLE \`sign_in_throttles\``);
    }

}
