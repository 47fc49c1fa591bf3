import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Triage figures on `cases` for the officers' queue: risk state, mould index, HHSRS band and
 * category, recurrence, priority and the next deadline. Existing rows get `triage_due_at` = now,
 * so they are worked out on first use. `idx_cases_queue` is descending on priority (the queue's
 * default order), which TypeORM cannot declare; the entity marks it `synchronize: false`.
 */
export class TriageFigures1796188877489 implements MigrationInterface {
    name = 'TriageFigures1796188877489'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`risk_state\` varchar(12) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`mould_index\` decimal(4,2) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`hhsrs_band\` char(1) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`hhsrs_category\` tinyint UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`recurrence\` tinyint NOT NULL DEFAULT 0`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`priority\` tinyint UNSIGNED NOT NULL DEFAULT '0'`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`next_stage\` varchar(20) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`next_due_at\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`triage_due_at\` datetime(3) NULL DEFAULT CURRENT_TIMESTAMP(3)`);
        await queryRunner.query(`CREATE INDEX \`idx_cases_triage_due\` ON \`cases\` (\`triage_due_at\`)`);
        await queryRunner.query(`CREATE INDEX \`idx_cases_org_due\` ON \`cases\` (\`organisation_id\`, \`next_due_at\`)`);
        await queryRunner.query(`CREATE INDEX \`idx_cases_queue\` ON \`cases\` (\`organisation_id\`, \`priority\` DESC, \`next_due_at\`)`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_cases_queue\` ON \`cases\``);
        await queryRunner.query(`DROP INDEX \`idx_cases_org_due\` ON \`cases\``);
        await queryRunner.query(`DROP INDEX \`idx_cases_triage_due\` ON \`cases\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`triage_due_at\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`next_due_at\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`next_stage\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`priority\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`recurrence\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`hhsrs_category\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`hhsrs_band\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`mould_index\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`risk_state\``);
    }

}
