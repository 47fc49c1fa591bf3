import { MigrationInterface, QueryRunner } from "typeorm";

export class CaseAssigneeAndHazardClass1796184941727 implements MigrationInterface {
    name = 'CaseAssigneeAndHazardClass1796184941727'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`assignee_user_id\` int UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`hazard_class\` varchar(20) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`hazard_class_reason\` text NULL`);
        await queryRunner.query(`CREATE INDEX \`idx_cases_org_assignee\` ON \`cases\` (\`organisation_id\`, \`assignee_user_id\`)`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_cases_org_assignee\` ON \`cases\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`hazard_class_reason\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`hazard_class\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`assignee_user_id\``);
    }

}
