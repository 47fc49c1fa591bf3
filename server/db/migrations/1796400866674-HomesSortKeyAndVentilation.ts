import { MigrationInterface, QueryRunner } from "typeorm";

export class HomesSortKeyAndVentilation1796400866674 implements MigrationInterface {
    name = 'HomesSortKeyAndVentilation1796400866674'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`ventilation\` varchar(30) NOT NULL DEFAULT 'not-recorded'`);
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`sort_key\` varchar(400) NOT NULL DEFAULT ''`);
        await queryRunner.query(`CREATE INDEX \`idx_properties_org_sort\` ON \`properties\` (\`organisation_id\`, \`estate\`, \`sort_key\`)`);
        // Added by hand: MariaDB keeps the natural sort key of the address on every write (a generated
        // column may not call NATURAL_SORT_KEY), and the existing homes get theirs now.
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_sort_key_insert\` BEFORE INSERT ON \`properties\` FOR EACH ROW SET NEW.sort_key = NATURAL_SORT_KEY(LEFT(CONCAT_WS(' ', NEW.block, NEW.address_line1, NEW.address_line2), 200))`);
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_sort_key_update\` BEFORE UPDATE ON \`properties\` FOR EACH ROW SET NEW.sort_key = NATURAL_SORT_KEY(LEFT(CONCAT_WS(' ', NEW.block, NEW.address_line1, NEW.address_line2), 200))`);
        await queryRunner.query(`UPDATE \`properties\` SET \`sort_key\` = NATURAL_SORT_KEY(LEFT(CONCAT_WS(' ', \`block\`, \`address_line1\`, \`address_line2\`), 200))`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TRIGGER \`trg_properties_sort_key_update\``);
        await queryRunner.query(`DROP TRIGGER \`trg_properties_sort_key_insert\``);
        await queryRunner.query(`DROP INDEX \`idx_properties_org_sort\` ON \`properties\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`sort_key\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`ventilation\``);
    }

}
