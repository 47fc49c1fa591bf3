import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Indexes for the default order of the exports' keyset pages, the sort columns then the id, so each
 * page is an index range read in order instead of a scan and filesort of the landlord's whole table:
 * work orders by target date, accounts by role and name, a case's readings across all rooms by time
 * and room.
 */
export class ExportSortIndexes1796436010598 implements MigrationInterface {
    name = 'ExportSortIndexes1796436010598'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE INDEX \`idx_work_orders_org_target\` ON \`work_orders\` (\`organisation_id\`, \`target_date\`, \`id\`)`);
        await queryRunner.query(`CREATE INDEX \`idx_users_org_role_name\` ON \`users\` (\`organisation_id\`, \`role\`, \`name\`, \`id\`)`);
        await queryRunner.query(`CREATE INDEX \`idx_readings_case_time_room\` ON \`readings\` (\`case_id\`, \`taken_at\`, \`room_id\`, \`id\`)`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_readings_case_time_room\` ON \`readings\``);
        await queryRunner.query(`DROP INDEX \`idx_users_org_role_name\` ON \`users\``);
        await queryRunner.query(`DROP INDEX \`idx_work_orders_org_target\` ON \`work_orders\``);
    }

}
