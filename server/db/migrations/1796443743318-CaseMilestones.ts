import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * The dashboard's stored projection of each case's clocks: one row per deadline stage that applies
 * (due, done) and one for the works completed, with the working days from awareness to done. Written
 * only by CaseService.storeTriageFigures, beside next_stage/next_due_at. Backfill: every case's triage
 * figures are marked due, so the triage sweep (and the dashboard's own refresh) writes its rows.
 */
export class CaseMilestones1796443743318 implements MigrationInterface {
    name = 'CaseMilestones1796443743318'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`case_milestones\` (\`case_id\` int UNSIGNED NOT NULL, \`milestone\` varchar(20) NOT NULL, \`organisation_id\` int UNSIGNED NOT NULL, \`due_at\` datetime(3) NULL, \`done_at\` datetime(3) NULL, \`working_days\` smallint NULL, INDEX \`idx_case_milestones_org_milestone\` (\`organisation_id\`, \`milestone\`, \`due_at\`), PRIMARY KEY (\`case_id\`, \`milestone\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE INDEX \`idx_cases_org_aware\` ON \`cases\` (\`organisation_id\`, \`aware_at\`)`);
        await queryRunner.query(`CREATE INDEX \`idx_cases_property_aware\` ON \`cases\` (\`property_id\`, \`aware_at\`)`);
        await queryRunner.query(`UPDATE \`cases\` SET \`triage_due_at\` = CURRENT_TIMESTAMP(3) WHERE \`triage_due_at\` IS NULL OR \`triage_due_at\` > CURRENT_TIMESTAMP(3)`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_cases_property_aware\` ON \`cases\``);
        await queryRunner.query(`DROP INDEX \`idx_cases_org_aware\` ON \`cases\``);
        await queryRunner.query(`DROP INDEX \`idx_case_milestones_org_milestone\` ON \`case_milestones\``);
        await queryRunner.query(`DROP TABLE \`case_milestones\``);
    }

}
