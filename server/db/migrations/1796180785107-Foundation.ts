import { MigrationInterface, QueryRunner } from "typeorm";

export class Foundation1796180785107 implements MigrationInterface {
    name = 'Foundation1796180785107'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`organisations\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`name\` varchar(190) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`users\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`email\` varchar(190) NOT NULL, \`name\` varchar(190) NOT NULL, \`password_hash\` varchar(255) NULL, \`role\` varchar(20) NOT NULL, \`status\` varchar(20) NOT NULL DEFAULT 'active', \`last_sign_in_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_users_email\` (\`email\`), INDEX \`idx_users_organisation_role\` (\`organisation_id\`, \`role\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`user_tokens\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`user_id\` int UNSIGNED NOT NULL, \`purpose\` varchar(20) NOT NULL, \`token_hash\` char(64) NOT NULL, \`expires_at\` datetime(3) NOT NULL, \`used_at\` datetime(3) NULL, \`created_by_id\` int UNSIGNED NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_user_tokens_hash\` (\`token_hash\`), INDEX \`idx_user_tokens_user\` (\`user_id\`, \`purpose\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`outbox_emails\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NULL, \`to_address\` varchar(190) NOT NULL, \`subject\` varchar(255) NOT NULL, \`template\` varchar(60) NOT NULL, \`related_type\` varchar(40) NULL, \`related_id\` int UNSIGNED NULL, \`status\` varchar(10) NOT NULL DEFAULT 'pending', \`error\` text NULL, \`message_id\` varchar(255) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`sent_at\` datetime(3) NULL, INDEX \`idx_outbox_org_created\` (\`organisation_id\`, \`created_at\`), INDEX \`idx_outbox_related\` (\`related_type\`, \`related_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`rooms\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`property_id\` int UNSIGNED NOT NULL, \`name\` varchar(100) NOT NULL, \`kind\` varchar(20) NOT NULL, INDEX \`idx_rooms_property\` (\`property_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`properties\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`address_line1\` varchar(190) NOT NULL, \`address_line2\` varchar(190) NULL, \`town\` varchar(100) NOT NULL, \`postcode\` varchar(10) NOT NULL, \`uprn\` varchar(12) NULL, \`estate\` varchar(100) NOT NULL, \`block\` varchar(100) NULL, \`built_form\` varchar(20) NOT NULL, \`wall_type\` varchar(20) NOT NULL, \`glazing_type\` varchar(20) NOT NULL, \`heating_type\` varchar(20) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_properties_org_uprn\` (\`organisation_id\`, \`uprn\`), INDEX \`idx_properties_org_postcode\` (\`organisation_id\`, \`postcode\`), INDEX \`idx_properties_org_estate\` (\`organisation_id\`, \`estate\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`tenancies\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`property_id\` int UNSIGNED NOT NULL, \`tenant_user_id\` int UNSIGNED NOT NULL, \`start_date\` date NOT NULL, \`end_date\` date NULL, \`household_notes\` text NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_tenancies_property\` (\`property_id\`, \`end_date\`), INDEX \`idx_tenancies_tenant\` (\`tenant_user_id\`, \`end_date\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`users\` ADD CONSTRAINT \`FK_2fc4294f8ec97da71d587dc5577\` FOREIGN KEY (\`organisation_id\`) REFERENCES \`organisations\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`user_tokens\` ADD CONSTRAINT \`FK_9e144a67be49e5bba91195ef5de\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`rooms\` ADD CONSTRAINT \`FK_f3a3e21cdec3d9f8069edf6f52f\` FOREIGN KEY (\`property_id\`) REFERENCES \`properties\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD CONSTRAINT \`FK_86fef120e7b301552ae74727bf1\` FOREIGN KEY (\`organisation_id\`) REFERENCES \`organisations\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`tenancies\` ADD CONSTRAINT \`FK_fb2f0d309817e9daefc22befa6a\` FOREIGN KEY (\`property_id\`) REFERENCES \`properties\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`tenancies\` ADD CONSTRAINT \`FK_91e2a0251b2f4bbc1bd1f5fbbd4\` FOREIGN KEY (\`tenant_user_id\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        // Session store table for express-mysql-session (its own schema.sql), owned by our migrations.
        await queryRunner.query(`CREATE TABLE \`sessions\` (\`session_id\` varchar(128) COLLATE utf8mb4_bin NOT NULL, \`expires\` int(11) UNSIGNED NOT NULL, \`data\` mediumtext COLLATE utf8mb4_bin, PRIMARY KEY (\`session_id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`sessions\``);
        await queryRunner.query(`ALTER TABLE \`tenancies\` DROP FOREIGN KEY \`FK_91e2a0251b2f4bbc1bd1f5fbbd4\``);
        await queryRunner.query(`ALTER TABLE \`tenancies\` DROP FOREIGN KEY \`FK_fb2f0d309817e9daefc22befa6a\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP FOREIGN KEY \`FK_86fef120e7b301552ae74727bf1\``);
        await queryRunner.query(`ALTER TABLE \`rooms\` DROP FOREIGN KEY \`FK_f3a3e21cdec3d9f8069edf6f52f\``);
        await queryRunner.query(`ALTER TABLE \`user_tokens\` DROP FOREIGN KEY \`FK_9e144a67be49e5bba91195ef5de\``);
        await queryRunner.query(`ALTER TABLE \`users\` DROP FOREIGN KEY \`FK_2fc4294f8ec97da71d587dc5577\``);
        await queryRunner.query(`DROP INDEX \`idx_tenancies_tenant\` ON \`tenancies\``);
        await queryRunner.query(`DROP INDEX \`idx_tenancies_property\` ON \`tenancies\``);
        await queryRunner.query(`DROP TABLE \`tenancies\``);
        await queryRunner.query(`DROP INDEX \`idx_properties_org_estate\` ON \`properties\``);
        await queryRunner.query(`DROP INDEX \`idx_properties_org_postcode\` ON \`properties\``);
        await queryRunner.query(`DROP INDEX \`uq_properties_org_uprn\` ON \`properties\``);
        await queryRunner.query(`DROP TABLE \`properties\``);
        await queryRunner.query(`DROP INDEX \`idx_rooms_property\` ON \`rooms\``);
        await queryRunner.query(`DROP TABLE \`rooms\``);
        await queryRunner.query(`DROP INDEX \`idx_outbox_related\` ON \`outbox_emails\``);
        await queryRunner.query(`DROP INDEX \`idx_outbox_org_created\` ON \`outbox_emails\``);
        await queryRunner.query(`DROP TABLE \`outbox_emails\``);
        await queryRunner.query(`DROP INDEX \`idx_user_tokens_user\` ON \`user_tokens\``);
        await queryRunner.query(`DROP INDEX \`uq_user_tokens_hash\` ON \`user_tokens\``);
        await queryRunner.query(`DROP TABLE \`user_tokens\``);
        await queryRunner.query(`DROP INDEX \`idx_users_organisation_role\` ON \`users\``);
        await queryRunner.query(`DROP INDEX \`uq_users_email\` ON \`users\``);
        await queryRunner.query(`DROP TABLE \`users\``);
        await queryRunner.query(`DROP TABLE \`organisations\``);
    }

}
