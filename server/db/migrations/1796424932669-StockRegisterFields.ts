import { MigrationInterface, QueryRunner } from "typeorm";

export class StockRegisterFields1796424932669 implements MigrationInterface {
    name = 'StockRegisterFields1796424932669'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`stock_imports\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`uploaded_by_id\` int UNSIGNED NOT NULL, \`file_name\` varchar(255) NOT NULL, \`created\` int UNSIGNED NOT NULL, \`updated\` int UNSIGNED NOT NULL, \`unchanged\` int UNSIGNED NOT NULL, \`refused\` int UNSIGNED NOT NULL, \`report\` mediumtext NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_stock_imports_org\` (\`organisation_id\`, \`created_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`built_year\` smallint UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`age_band\` varchar(20) NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`wall_insulation\` varchar(20) NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`roof_insulation_mm\` smallint UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`heating_fuel\` varchar(20) NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`has_extract_fans\` tinyint NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`has_trickle_vents\` tinyint NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`floor_area_m2\` decimal(6,1) NULL`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`epc_band\` char(1) NULL`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`epc_band\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`floor_area_m2\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`has_trickle_vents\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`has_extract_fans\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`heating_fuel\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`roof_insulation_mm\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`wall_insulation\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`age_band\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`built_year\``);
        await queryRunner.query(`DROP INDEX \`idx_stock_imports_org\` ON \`stock_imports\``);
        await queryRunner.query(`DROP TABLE \`stock_imports\``);
    }

}
