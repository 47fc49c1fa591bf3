import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Written by hand. A deep page of the queue in its default order (priority, then the nearest deadline)
 * had MariaDB step over every case before it in idx_cases_queue: page 2 000 of 25 walked 50 000 index
 * entries, 10–15 ms on every view (bench:queue). MariaDB now keeps the number of cases per landlord,
 * status and priority in `case_priority_counts`, by triggers, as `case_status_counts` keeps them per
 * status (migration CaseStatusCounts: same statement and transaction as the case row, atomic `n = n ± 1`,
 * slots so that cases written at the same moment rarely wait for one row's lock). The queue then starts
 * a deep page at the first case of the priority it falls in (QueueService: `priority <= p` and an offset
 * inside that priority), so it walks at most one priority's cases.
 */
const PUT = (row: "NEW" | "OLD", change: "+ 1" | "- 1") =>
  change === "+ 1"
    ? `INSERT INTO \`case_priority_counts\` (\`organisation_id\`, \`status\`, \`priority\`, \`slot\`, \`n\`) VALUES (NEW.\`organisation_id\`, NEW.\`status\`, NEW.\`priority\`, NEW.\`id\` MOD 4, 1) ON DUPLICATE KEY UPDATE \`n\` = \`n\` + 1`
    : `UPDATE \`case_priority_counts\` SET \`n\` = \`n\` - 1 WHERE \`organisation_id\` = ${row}.\`organisation_id\` AND \`status\` = ${row}.\`status\` AND \`priority\` = ${row}.\`priority\` AND \`slot\` = ${row}.\`id\` MOD 4`;

export class CasePriorityCounts1796463500000 implements MigrationInterface {
    name = 'CasePriorityCounts1796463500000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`case_priority_counts\` (\`organisation_id\` int UNSIGNED NOT NULL, \`status\` varchar(20) NOT NULL, \`priority\` tinyint UNSIGNED NOT NULL, \`slot\` tinyint UNSIGNED NOT NULL, \`n\` int NOT NULL DEFAULT 0, PRIMARY KEY (\`organisation_id\`, \`status\`, \`priority\`, \`slot\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TRIGGER \`trg_cases_priority_count_insert\` AFTER INSERT ON \`cases\` FOR EACH ROW ${PUT("NEW", "+ 1")}`);
        await queryRunner.query(`CREATE TRIGGER \`trg_cases_priority_count_delete\` AFTER DELETE ON \`cases\` FOR EACH ROW ${PUT("OLD", "- 1")}`);
        // A move changes two rows, always locked in key order: two cases moving between the same two
        // rows in opposite directions wait for each other instead of deadlocking.
        await queryRunner.query(`CREATE TRIGGER \`trg_cases_priority_count_update\` AFTER UPDATE ON \`cases\` FOR EACH ROW
BEGIN
  IF NOT (OLD.\`status\` <=> NEW.\`status\` AND OLD.\`priority\` <=> NEW.\`priority\` AND OLD.\`organisation_id\` <=> NEW.\`organisation_id\` AND OLD.\`id\` <=> NEW.\`id\`) THEN
    IF (OLD.\`organisation_id\`, OLD.\`status\`, OLD.\`priority\`, OLD.\`id\` MOD 4) < (NEW.\`organisation_id\`, NEW.\`status\`, NEW.\`priority\`, NEW.\`id\` MOD 4) THEN
      ${PUT("OLD", "- 1")};
      ${PUT("NEW", "+ 1")};
    ELSE
      ${PUT("NEW", "+ 1")};
      ${PUT("OLD", "- 1")};
    END IF;
  END IF;
END`);
        // The cases already there. Migrations run before the app serves (npm start, db:migrate), so no
        // case is written between the triggers' creation and this count.
        await queryRunner.query(`INSERT INTO \`case_priority_counts\` (\`organisation_id\`, \`status\`, \`priority\`, \`slot\`, \`n\`) SELECT \`organisation_id\`, \`status\`, \`priority\`, \`id\` MOD 4, COUNT(*) FROM \`cases\` GROUP BY \`organisation_id\`, \`status\`, \`priority\`, \`id\` MOD 4`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TRIGGER \`trg_cases_priority_count_update\``);
        await queryRunner.query(`DROP TRIGGER \`trg_cases_priority_count_delete\``);
        await queryRunner.query(`DROP TRIGGER \`trg_cases_priority_count_insert\``);
        await queryRunner.query(`DROP TABLE \`case_priority_counts\``);
    }

}
