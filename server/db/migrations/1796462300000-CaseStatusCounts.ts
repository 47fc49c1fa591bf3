import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Written by hand. The queue's total for its common views (the open cases, or every case) was a COUNT(*)
 * over thousands of index entries on every page view (bench:queue). MariaDB now keeps the number of
 * cases per landlord and status in `case_status_counts`, changed by triggers in the same statement,
 * and so in the same transaction, as the case row: every write path (the services, LOAD DATA, a
 * hand-run UPDATE) keeps it exact, a rolled-back change takes its count with it, and `n = n ± 1` is
 * one atomic update, never a read-modify-write that two transactions (or two Galera nodes) could
 * interleave. Each landlord's counts are spread over 8 slots (the case id mod 8) so that reports made
 * at the same moment do not all wait for one row's lock; a reader sums the slots.
 */
export class CaseStatusCounts1796462300000 implements MigrationInterface {
    name = 'CaseStatusCounts1796462300000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        // A search's cases by home, in the queue's default order, from the index alone.
        await queryRunner.query(`CREATE INDEX \`idx_cases_org_property_queue\` ON \`cases\` (\`organisation_id\`, \`property_id\`, \`priority\`, \`next_due_at\`)`);
        await queryRunner.query(`CREATE TABLE \`case_status_counts\` (\`organisation_id\` int UNSIGNED NOT NULL, \`status\` varchar(20) NOT NULL, \`slot\` tinyint UNSIGNED NOT NULL, \`n\` int NOT NULL DEFAULT 0, PRIMARY KEY (\`organisation_id\`, \`status\`, \`slot\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TRIGGER \`trg_cases_count_insert\` AFTER INSERT ON \`cases\` FOR EACH ROW INSERT INTO \`case_status_counts\` (\`organisation_id\`, \`status\`, \`slot\`, \`n\`) VALUES (NEW.\`organisation_id\`, NEW.\`status\`, NEW.\`id\` MOD 8, 1) ON DUPLICATE KEY UPDATE \`n\` = \`n\` + 1`);
        await queryRunner.query(`CREATE TRIGGER \`trg_cases_count_delete\` AFTER DELETE ON \`cases\` FOR EACH ROW UPDATE \`case_status_counts\` SET \`n\` = \`n\` - 1 WHERE \`organisation_id\` = OLD.\`organisation_id\` AND \`status\` = OLD.\`status\` AND \`slot\` = OLD.\`id\` MOD 8`);
        // A move changes two rows; they are always locked in key order, so two cases moving between the
        // same two statuses in opposite directions wait for each other instead of deadlocking.
        await queryRunner.query(`CREATE TRIGGER \`trg_cases_count_update\` AFTER UPDATE ON \`cases\` FOR EACH ROW
BEGIN
  IF NOT (OLD.\`status\` <=> NEW.\`status\` AND OLD.\`organisation_id\` <=> NEW.\`organisation_id\` AND OLD.\`id\` <=> NEW.\`id\`) THEN
    IF (OLD.\`organisation_id\`, OLD.\`status\`, OLD.\`id\` MOD 8) < (NEW.\`organisation_id\`, NEW.\`status\`, NEW.\`id\` MOD 8) THEN
      UPDATE \`case_status_counts\` SET \`n\` = \`n\` - 1 WHERE \`organisation_id\` = OLD.\`organisation_id\` AND \`status\` = OLD.\`status\` AND \`slot\` = OLD.\`id\` MOD 8;
      INSERT INTO \`case_status_counts\` (\`organisation_id\`, \`status\`, \`slot\`, \`n\`) VALUES (NEW.\`organisation_id\`, NEW.\`status\`, NEW.\`id\` MOD 8, 1) ON DUPLICATE KEY UPDATE \`n\` = \`n\` + 1;
    ELSE
      INSERT INTO \`case_status_counts\` (\`organisation_id\`, \`status\`, \`slot\`, \`n\`) VALUES (NEW.\`organisation_id\`, NEW.\`status\`, NEW.\`id\` MOD 8, 1) ON DUPLICATE KEY UPDATE \`n\` = \`n\` + 1;
      UPDATE \`case_status_counts\` SET \`n\` = \`n\` - 1 WHERE \`organisation_id\` = OLD.\`organisation_id\` AND \`status\` = OLD.\`status\` AND \`slot\` = OLD.\`id\` MOD 8;
    END IF;
  END IF;
END`);
        // The cases already there. Migrations run before the app serves (npm start, db:migrate), so no
        // case is written between the triggers' creation and this count.
        await queryRunner.query(`INSERT INTO \`case_status_counts\` (\`organisation_id\`, \`status\`, \`slot\`, \`n\`) SELECT \`organisation_id\`, \`status\`, \`id\` MOD 8, COUNT(*) FROM \`cases\` GROUP BY \`organisation_id\`, \`status\`, \`id\` MOD 8`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TRIGGER \`trg_cases_count_update\``);
        await queryRunner.query(`DROP TRIGGER \`trg_cases_count_delete\``);
        await queryRunner.query(`DROP TRIGGER \`trg_cases_count_insert\``);
        await queryRunner.query(`DROP TABLE \`case_status_counts\``);
        await queryRunner.query(`DROP INDEX \`idx_cases_org_property_queue\` ON \`cases\``);
    }

}
