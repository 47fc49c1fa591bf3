import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Written by hand. Text messages to tenants: each tenant's mobile number and on/off choice
 * (`sms_preferences`, no row: texts off), and the texts' outbox (`outbox_sms`), sent by a leased relay
 * like the e-mail outbox. `once_key` is unique so a reminder for one booking is queued once only.
 */
export class TextMessages1796462700000 implements MigrationInterface {
    name = 'TextMessages1796462700000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`sms_preferences\` (\`user_id\` int UNSIGNED NOT NULL, \`mobile_number\` varchar(16) NULL, \`texts_on\` tinyint NOT NULL DEFAULT 0, \`opted_in_at\` datetime(3) NULL, \`opted_out_at\` datetime(3) NULL, \`updated_at\` datetime(3) NOT NULL, PRIMARY KEY (\`user_id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`outbox_sms\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`user_id\` int UNSIGNED NOT NULL, \`to_number\` varchar(16) NOT NULL, \`kind\` varchar(40) NOT NULL, \`body\` text NOT NULL, \`related_type\` varchar(40) NULL, \`related_id\` int UNSIGNED NULL, \`once_key\` varchar(100) NULL, \`status\` varchar(10) NOT NULL DEFAULT 'pending', \`error\` text NULL, \`attempts\` smallint UNSIGNED NOT NULL DEFAULT 0, \`next_attempt_at\` datetime(3) NULL, \`lease_token\` varchar(64) NULL, \`lease_expires_at\` datetime(3) NULL, \`provider_id\` varchar(64) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`last_attempt_at\` datetime(3) NULL, \`sent_at\` datetime(3) NULL, UNIQUE INDEX \`uq_outbox_sms_once\` (\`once_key\`), INDEX \`idx_outbox_sms_due\` (\`status\`, \`next_attempt_at\`), INDEX \`idx_outbox_sms_related\` (\`related_type\`, \`related_id\`), INDEX \`idx_outbox_sms_user\` (\`user_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`outbox_sms\``);
        await queryRunner.query(`DROP TABLE \`sms_preferences\``);
    }
}
