import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * `deadline_digests`: which officer has had the morning deadline digest for which London day.
 * UNIQUE(user_id, digest_date) is what makes the digest go out at most once per officer per day;
 * the row is written in the same transaction as its outbox e-mail.
 */
export class DeadlineDigests1796189021283 implements MigrationInterface {
    name = 'DeadlineDigests1796189021283'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`deadline_digests\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`user_id\` int UNSIGNED NOT NULL, \`digest_date\` date NOT NULL, \`outbox_email_id\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_deadline_digests_user_date\` (\`user_id\`, \`digest_date\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`deadline_digests\` ADD CONSTRAINT \`FK_3f5728d2c2dc4b3713634eed3c8\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`deadline_digests\` ADD CONSTRAINT \`FK_512042168c881ff23fc076950a6\` FOREIGN KEY (\`outbox_email_id\`) REFERENCES \`outbox_emails\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`deadline_digests\` DROP FOREIGN KEY \`FK_512042168c881ff23fc076950a6\``);
        await queryRunner.query(`ALTER TABLE \`deadline_digests\` DROP FOREIGN KEY \`FK_3f5728d2c2dc4b3713634eed3c8\``);
        await queryRunner.query(`DROP INDEX \`uq_deadline_digests_user_date\` ON \`deadline_digests\``);
        await queryRunner.query(`DROP TABLE \`deadline_digests\``);
    }

}
