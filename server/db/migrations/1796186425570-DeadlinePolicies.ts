import { MigrationInterface, QueryRunner } from "typeorm";

export class DeadlinePolicies1796186425570 implements MigrationInterface {
    name = 'DeadlinePolicies1796186425570'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`deadline_policies\` (\`organisation_id\` int UNSIGNED NOT NULL, \`emergency_make_safe_hours\` smallint UNSIGNED NOT NULL, \`investigate_working_days\` smallint UNSIGNED NOT NULL, \`summary_working_days\` smallint UNSIGNED NOT NULL, \`safety_work_working_days\` smallint UNSIGNED NOT NULL, \`supplementary_work_weeks\` smallint UNSIGNED NOT NULL, \`updated_by_id\` int UNSIGNED NOT NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (\`organisation_id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`deadline_policies\``);
    }

}
