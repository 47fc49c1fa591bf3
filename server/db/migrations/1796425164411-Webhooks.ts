import { MigrationInterface, QueryRunner } from "typeorm";

export class Webhooks1796425164411 implements MigrationInterface {
    name = 'Webhooks1796425164411'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`webhook_endpoints\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`url\` varchar(2000) NOT NULL, \`description\` varchar(200) NOT NULL DEFAULT '', \`event_types\` text NOT NULL, \`secret\` varchar(100) NOT NULL, \`previous_secret\` varchar(100) NULL, \`previous_secret_until\` datetime(3) NULL, \`secret_rotated_at\` datetime(3) NULL, \`active\` tinyint NOT NULL DEFAULT 1, \`created_by_user_id\` int UNSIGNED NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`idx_webhook_endpoints_org\` (\`organisation_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`webhook_events\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`uid\` char(36) NOT NULL, \`organisation_id\` int UNSIGNED NOT NULL, \`type\` varchar(40) NOT NULL, \`case_id\` int UNSIGNED NULL, \`case_reference\` varchar(20) NULL, \`dedupe_key\` varchar(120) NULL, \`body\` mediumtext NOT NULL, \`occurred_at\` datetime(3) NOT NULL, INDEX \`idx_webhook_events_org\` (\`organisation_id\`, \`id\`), UNIQUE INDEX \`uq_webhook_events_dedupe\` (\`dedupe_key\`), UNIQUE INDEX \`uq_webhook_events_uid\` (\`uid\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`webhook_deliveries\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`event_id\` int UNSIGNED NOT NULL, \`endpoint_id\` int UNSIGNED NOT NULL, \`organisation_id\` int UNSIGNED NOT NULL, \`status\` varchar(10) NOT NULL DEFAULT 'pending', \`attempts\` smallint UNSIGNED NOT NULL DEFAULT '0', \`next_attempt_at\` datetime(3) NULL, \`lease_token\` varchar(64) NULL, \`lease_expires_at\` datetime(3) NULL, \`delivered_at\` datetime(3) NULL, \`resent_by_user_id\` int UNSIGNED NULL, \`resent_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_webhook_deliveries_endpoint\` (\`endpoint_id\`, \`id\`), INDEX \`idx_webhook_deliveries_due\` (\`status\`, \`next_attempt_at\`), UNIQUE INDEX \`uq_webhook_deliveries_event_endpoint\` (\`event_id\`, \`endpoint_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`webhook_attempts\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`delivery_id\` int UNSIGNED NOT NULL, \`attempted_at\` datetime(3) NOT NULL, \`status_code\` smallint UNSIGNED NULL, \`error\` varchar(500) NULL, \`duration_ms\` int UNSIGNED NOT NULL, INDEX \`idx_webhook_attempts_delivery\` (\`delivery_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`webhook_deliveries\` ADD CONSTRAINT \`FK_webhook_deliveries_event\` FOREIGN KEY (\`event_id\`) REFERENCES \`webhook_events\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`webhook_deliveries\` ADD CONSTRAINT \`FK_webhook_deliveries_endpoint\` FOREIGN KEY (\`endpoint_id\`) REFERENCES \`webhook_endpoints\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`webhook_attempts\` ADD CONSTRAINT \`FK_webhook_attempts_delivery\` FOREIGN KEY (\`delivery_id\`) REFERENCES \`webhook_deliveries\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`webhook_attempts\` DROP FOREIGN KEY \`FK_webhook_attempts_delivery\``);
        await queryRunner.query(`ALTER TABLE \`webhook_deliveries\` DROP FOREIGN KEY \`FK_webhook_deliveries_endpoint\``);
        await queryRunner.query(`ALTER TABLE \`webhook_deliveries\` DROP FOREIGN KEY \`FK_webhook_deliveries_event\``);
        await queryRunner.query(`DROP INDEX \`idx_webhook_attempts_delivery\` ON \`webhook_attempts\``);
        await queryRunner.query(`DROP TABLE \`webhook_attempts\``);
        await queryRunner.query(`DROP INDEX \`uq_webhook_deliveries_event_endpoint\` ON \`webhook_deliveries\``);
        await queryRunner.query(`DROP INDEX \`idx_webhook_deliveries_due\` ON \`webhook_deliveries\``);
        await queryRunner.query(`DROP INDEX \`idx_webhook_deliveries_endpoint\` ON \`webhook_deliveries\``);
        await queryRunner.query(`DROP TABLE \`webhook_deliveries\``);
        await queryRunner.query(`DROP INDEX \`uq_webhook_events_uid\` ON \`webhook_events\``);
        await queryRunner.query(`DROP INDEX \`uq_webhook_events_dedupe\` ON \`webhook_events\``);
        await queryRunner.query(`DROP INDEX \`idx_webhook_events_org\` ON \`webhook_events\``);
        await queryRunner.query(`DROP TABLE \`webhook_events\``);
        await queryRunner.query(`DROP INDEX \`idx_webhook_endpoints_org\` ON \`webhook_endpoints\``);
        await queryRunner.query(`DROP TABLE \`webhook_endpoints\``);
    }

}
