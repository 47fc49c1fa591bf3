import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Formal complaints (complaints module): one row per complaint with both stages' facts and the remedy,
 * one open complaint per case by the unique `open_case_id`; and each landlord's complaint timeframes,
 * escalation route and letters (policy module).
 */
export class Complaints1796444351206 implements MigrationInterface {
    name = 'Complaints1796444351206'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`complaint_policies\` (\`organisation_id\` int UNSIGNED NOT NULL, \`stage1_acknowledge_working_days\` smallint UNSIGNED NOT NULL, \`stage1_respond_working_days\` smallint UNSIGNED NOT NULL, \`stage2_acknowledge_working_days\` smallint UNSIGNED NOT NULL, \`stage2_respond_working_days\` smallint UNSIGNED NOT NULL, \`extension_max_working_days\` smallint UNSIGNED NOT NULL, \`escalation_route\` text NULL, \`updated_by_id\` int UNSIGNED NOT NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (\`organisation_id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`complaint_letter_templates\` (\`organisation_id\` int UNSIGNED NOT NULL, \`kind\` varchar(24) NOT NULL, \`subject\` varchar(200) NOT NULL, \`body\` text NOT NULL, \`updated_by_id\` int UNSIGNED NOT NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (\`organisation_id\`, \`kind\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`complaints\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`case_id\` int UNSIGNED NOT NULL, \`open_case_id\` int UNSIGNED NULL, \`status\` varchar(24) NOT NULL, \`version\` int UNSIGNED NOT NULL DEFAULT '1', \`raised_by_user_id\` int UNSIGNED NOT NULL, \`on_behalf\` tinyint NOT NULL DEFAULT 0, \`description\` text NOT NULL, \`raised_at\` datetime(3) NOT NULL, \`stage1_acknowledged_at\` datetime(3) NULL, \`stage1_extension_days\` smallint UNSIGNED NULL, \`stage1_extension_reason\` text NULL, \`stage1_responded_at\` datetime(3) NULL, \`stage1_response\` text NULL, \`escalated_at\` datetime(3) NULL, \`escalation_reason\` text NULL, \`stage2_acknowledged_at\` datetime(3) NULL, \`stage2_extension_days\` smallint UNSIGNED NULL, \`stage2_extension_reason\` text NULL, \`stage2_responded_at\` datetime(3) NULL, \`stage2_response\` text NULL, \`closed_at\` datetime(3) NULL, \`apology\` tinyint NOT NULL DEFAULT 0, \`apology_text\` text NULL, \`put_right\` text NULL, \`compensation_offered_pence\` int UNSIGNED NULL, \`compensation_offered_on\` date NULL, \`compensation_accepted_on\` date NULL, \`compensation_paid_pence\` int UNSIGNED NULL, \`compensation_paid_on\` date NULL, \`staff_note\` text NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_complaints_open_case\` (\`open_case_id\`), INDEX \`idx_complaints_org_raised\` (\`organisation_id\`, \`raised_at\`), INDEX \`idx_complaints_case\` (\`case_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`complaints\``);
        await queryRunner.query(`DROP TABLE \`complaint_letter_templates\``);
        await queryRunner.query(`DROP TABLE \`complaint_policies\``);
    }

}
