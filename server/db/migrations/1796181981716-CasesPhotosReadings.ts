import { MigrationInterface, QueryRunner } from "typeorm";

export class CasesPhotosReadings1796181981716 implements MigrationInterface {
    name = 'CasesPhotosReadings1796181981716'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`case_events\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`case_id\` int UNSIGNED NOT NULL, \`actor_user_id\` int UNSIGNED NULL, \`type\` varchar(40) NOT NULL, \`before\` text NULL, \`after\` text NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_case_events_case\` (\`case_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`cases\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`reference\` varchar(20) NULL, \`organisation_id\` int UNSIGNED NOT NULL, \`property_id\` int UNSIGNED NOT NULL, \`reporter_user_id\` int UNSIGNED NOT NULL, \`tenant_user_id\` int UNSIGNED NULL, \`channel\` varchar(20) NOT NULL, \`aware_at\` datetime(3) NOT NULL, \`description\` text NOT NULL, \`locations\` text NOT NULL, \`observations\` text NOT NULL, \`since\` varchar(20) NULL, \`area\` varchar(10) NULL, \`vulnerability\` text NULL, \`vulnerable_household\` tinyint NOT NULL DEFAULT 0, \`equipment\` text NULL, \`status\` varchar(20) NOT NULL DEFAULT 'new', \`officers_alerted_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_cases_reference\` (\`reference\`), INDEX \`idx_cases_tenant\` (\`tenant_user_id\`, \`created_at\`), INDEX \`idx_cases_property\` (\`property_id\`, \`created_at\`), INDEX \`idx_cases_org_status\` (\`organisation_id\`, \`status\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`photos\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`case_id\` int UNSIGNED NOT NULL, \`uploaded_by_id\` int UNSIGNED NOT NULL, \`display_path\` varchar(255) NOT NULL, \`thumbnail_path\` varchar(255) NOT NULL, \`width\` int UNSIGNED NOT NULL, \`height\` int UNSIGNED NOT NULL, \`bytes\` int UNSIGNED NOT NULL, \`sha256\` char(64) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_photos_case_sha\` (\`case_id\`, \`sha256\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`reading_imports\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`case_id\` int UNSIGNED NOT NULL, \`room_id\` int UNSIGNED NOT NULL, \`uploaded_by_id\` int UNSIGNED NOT NULL, \`file_name\` varchar(255) NOT NULL, \`imported\` int UNSIGNED NOT NULL, \`duplicates\` int UNSIGNED NOT NULL, \`rejected\` int UNSIGNED NOT NULL, \`rejected_report\` mediumtext NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_reading_imports_case\` (\`case_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`readings\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`case_id\` int UNSIGNED NOT NULL, \`room_id\` int UNSIGNED NOT NULL, \`taken_at\` datetime(0) NOT NULL, \`air_temperature_c\` decimal(5,2) NOT NULL, \`relative_humidity_pct\` decimal(5,2) NOT NULL, \`surface_temperature_c\` decimal(5,2) NULL, \`outdoor_temperature_c\` decimal(5,2) NULL, \`source\` varchar(10) NOT NULL, \`import_id\` int UNSIGNED NULL, UNIQUE INDEX \`uq_readings_case_room_time\` (\`case_id\`, \`room_id\`, \`taken_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`case_rooms\` (\`case_id\` int UNSIGNED NOT NULL, \`room_id\` int UNSIGNED NOT NULL, INDEX \`IDX_29d5cd9a212e1d54da2b50b45f\` (\`case_id\`), INDEX \`IDX_06e9ce99bb6388031873f0741f\` (\`room_id\`), PRIMARY KEY (\`case_id\`, \`room_id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD CONSTRAINT \`FK_b60dc0a36e55be6d20996aad2dd\` FOREIGN KEY (\`property_id\`) REFERENCES \`properties\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`case_rooms\` ADD CONSTRAINT \`FK_29d5cd9a212e1d54da2b50b45f2\` FOREIGN KEY (\`case_id\`) REFERENCES \`cases\`(\`id\`) ON DELETE CASCADE ON UPDATE CASCADE`);
        await queryRunner.query(`ALTER TABLE \`case_rooms\` ADD CONSTRAINT \`FK_06e9ce99bb6388031873f0741f7\` FOREIGN KEY (\`room_id\`) REFERENCES \`rooms\`(\`id\`) ON DELETE CASCADE ON UPDATE CASCADE`);
        // The case history is append-only: the database itself refuses edits and deletions.
        await queryRunner.query(`CREATE TRIGGER \`trg_case_events_no_update\` BEFORE UPDATE ON \`case_events\` FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'case_events is append-only'`);
        await queryRunner.query(`CREATE TRIGGER \`trg_case_events_no_delete\` BEFORE DELETE ON \`case_events\` FOR EACH ROW SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'case_events is append-only'`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TRIGGER \`trg_case_events_no_delete\``);
        await queryRunner.query(`DROP TRIGGER \`trg_case_events_no_update\``);
        await queryRunner.query(`ALTER TABLE \`case_rooms\` DROP FOREIGN KEY \`FK_06e9ce99bb6388031873f0741f7\``);
        await queryRunner.query(`ALTER TABLE \`case_rooms\` DROP FOREIGN KEY \`FK_29d5cd9a212e1d54da2b50b45f2\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP FOREIGN KEY \`FK_b60dc0a36e55be6d20996aad2dd\``);
        await queryRunner.query(`DROP INDEX \`IDX_06e9ce99bb6388031873f0741f\` ON \`case_rooms\``);
        await queryRunner.query(`DROP INDEX \`IDX_29d5cd9a212e1d54da2b50b45f\` ON \`case_rooms\``);
        await queryRunner.query(`DROP TABLE \`case_rooms\``);
        await queryRunner.query(`DROP INDEX \`uq_readings_case_room_time\` ON \`readings\``);
        await queryRunner.query(`DROP TABLE \`readings\``);
        await queryRunner.query(`DROP INDEX \`idx_reading_imports_case\` ON \`reading_imports\``);
        await queryRunner.query(`DROP TABLE \`reading_imports\``);
        await queryRunner.query(`DROP INDEX \`uq_photos_case_sha\` ON \`photos\``);
        await queryRunner.query(`DROP TABLE \`photos\``);
        await queryRunner.query(`DROP INDEX \`idx_cases_org_status\` ON \`cases\``);
        await queryRunner.query(`DROP INDEX \`idx_cases_property\` ON \`cases\``);
        await queryRunner.query(`DROP INDEX \`idx_cases_tenant\` ON \`cases\``);
        await queryRunner.query(`DROP INDEX \`uq_cases_reference\` ON \`cases\``);
        await queryRunner.query(`DROP TABLE \`cases\``);
        await queryRunner.query(`DROP INDEX \`idx_case_events_case\` ON \`case_events\``);
        await queryRunner.query(`DROP TABLE \`case_events\``);
    }

}
