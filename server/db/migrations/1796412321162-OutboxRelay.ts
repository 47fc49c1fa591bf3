import { MigrationInterface, QueryRunner } from "typeorm";

export class OutboxRelay1796412321162 implements MigrationInterface {
    name = 'OutboxRelay1796412321162'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`text_body\` mediumtext NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`html_body\` mediumtext NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`attachments\` longtext NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`attempts\` smallint UNSIGNED NOT NULL DEFAULT '0'`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`next_attempt_at\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`lease_token\` varchar(64) NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`lease_expires_at\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`last_attempt_at\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`resent_by_user_id\` int UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` ADD \`resent_at\` datetime(3) NULL`);
        await queryRunner.query(`CREATE INDEX \`idx_outbox_due\` ON \`outbox_emails\` (\`status\`, \`next_attempt_at\`)`);
        await queryRunner.query(`CREATE INDEX \`idx_outbox_org_status\` ON \`outbox_emails\` (\`organisation_id\`, \`status\`, \`id\`)`);
        // Rows queued before the outbox kept the message cannot be sent by the relay: say so, rather than leave them pending for ever.
        await queryRunner.query(`UPDATE \`outbox_emails\` SET \`status\` = 'failed', \`error\` = 'Queued before the outbox kept the message; it cannot be sent.' WHERE \`status\` = 'pending'`);
        await queryRunner.query(`UPDATE \`outbox_emails\` SET \`attempts\` = 1 WHERE \`status\` IN ('sent', 'failed')`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        // The old code knows no "sending"; without the relay nothing would send those rows again.
        await queryRunner.query(`UPDATE \`outbox_emails\` SET \`status\` = 'failed', \`error\` = 'Not sent: the outbox relay was removed.' WHERE \`status\` IN ('pending', 'sending')`);
        await queryRunner.query(`DROP INDEX \`idx_outbox_org_status\` ON \`outbox_emails\``);
        await queryRunner.query(`DROP INDEX \`idx_outbox_due\` ON \`outbox_emails\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`resent_at\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`resent_by_user_id\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`last_attempt_at\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`lease_expires_at\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`lease_token\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`next_attempt_at\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`attempts\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`attachments\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`html_body\``);
        await queryRunner.query(`ALTER TABLE \`outbox_emails\` DROP COLUMN \`text_body\``);
    }

}
