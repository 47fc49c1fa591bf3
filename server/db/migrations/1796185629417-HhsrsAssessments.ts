import { MigrationInterface, QueryRunner } from "typeorm";

export class HhsrsAssessments1796185629417 implements MigrationInterface {
    name = 'HhsrsAssessments1796185629417'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`hhsrs_assessments\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`case_id\` int UNSIGNED NOT NULL, \`version\` int UNSIGNED NOT NULL, \`assessor_user_id\` int UNSIGNED NOT NULL, \`likelihood\` int UNSIGNED NOT NULL, \`spread\` text NOT NULL, \`justification\` text NOT NULL, \`score\` double NOT NULL, \`band\` char(1) NOT NULL, \`category\` tinyint UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_hhsrs_assessments_case_version\` (\`case_id\`, \`version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`uq_hhsrs_assessments_case_version\` ON \`hhsrs_assessments\``);
        await queryRunner.query(`DROP TABLE \`hhsrs_assessments\``);
    }

}
