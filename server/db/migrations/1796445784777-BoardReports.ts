import { MigrationInterface, QueryRunner } from "typeorm";

/** The board report's list of addresses per landlord, and each month's sending (once per landlord and month). */
export class BoardReports1796445784777 implements MigrationInterface {
    name = 'BoardReports1796445784777'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`board_report_settings\` (\`organisation_id\` int UNSIGNED NOT NULL, \`recipients\` text NOT NULL, \`updated_by_id\` int UNSIGNED NULL, \`updated_at\` datetime(3) NOT NULL, PRIMARY KEY (\`organisation_id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`board_report_sends\` (\`organisation_id\` int UNSIGNED NOT NULL, \`month\` char(7) NOT NULL, \`sent_at\` datetime(3) NOT NULL, \`recipients\` smallint UNSIGNED NOT NULL, \`sent_by_id\` int UNSIGNED NULL, PRIMARY KEY (\`organisation_id\`, \`month\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`board_report_sends\``);
        await queryRunner.query(`DROP TABLE \`board_report_settings\``);
    }

}
