import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * The maintenance journey: work orders, their bookings (every appointment kept), the operatives'
 * booked half-days (a unique key refuses double-booking), contractors, after-works photos, the
 * monitoring period on cases and its length in the landlord's policy.
 */
export class WorkOrders1796191882151 implements MigrationInterface {
    name = 'WorkOrders1796191882151'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`work_order_bookings\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`work_order_id\` int UNSIGNED NOT NULL, \`assignee_user_id\` int UNSIGNED NULL, \`contractor_id\` int UNSIGNED NULL, \`slot_date\` date NOT NULL, \`slot_window\` varchar(10) NOT NULL, \`state\` varchar(10) NOT NULL DEFAULT 'active', \`tenant_response\` varchar(20) NULL, \`tenant_reason\` text NULL, \`responded_at\` datetime(3) NULL, \`created_by_id\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_bookings_work_order\` (\`work_order_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`contractors\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`name\` varchar(190) NOT NULL, \`email\` varchar(190) NOT NULL, \`phone\` varchar(40) NULL, \`trade\` varchar(100) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_contractors_org\` (\`organisation_id\`, \`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`operative_slots\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`user_id\` int UNSIGNED NOT NULL, \`slot_date\` date NOT NULL, \`half\` varchar(2) NOT NULL, \`booking_id\` int UNSIGNED NOT NULL, INDEX \`idx_operative_slots_booking\` (\`booking_id\`), UNIQUE INDEX \`uq_operative_slots\` (\`user_id\`, \`slot_date\`, \`half\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`work_orders\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`case_id\` int UNSIGNED NOT NULL, \`type\` varchar(30) NOT NULL, \`description\` text NOT NULL, \`room_ids\` text NOT NULL, \`priority\` varchar(10) NOT NULL, \`target_date\` date NOT NULL, \`status\` varchar(20) NOT NULL DEFAULT 'unscheduled', \`assignee_user_id\` int UNSIGNED NULL, \`contractor_id\` int UNSIGNED NULL, \`slot_date\` date NULL, \`slot_window\` varchar(10) NULL, \`schedule_count\` int UNSIGNED NOT NULL DEFAULT '0', \`completed_at\` datetime(3) NULL, \`completed_by_id\` int UNSIGNED NULL, \`completion_note\` text NULL, \`materials\` text NULL, \`minutes_on_site\` int UNSIGNED NULL, \`follow_on\` text NULL, \`created_by_id\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`idx_work_orders_org_assignee\` (\`organisation_id\`, \`assignee_user_id\`, \`slot_date\`), INDEX \`idx_work_orders_org_status\` (\`organisation_id\`, \`status\`, \`slot_date\`), INDEX \`idx_work_orders_case\` (\`case_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`works_done_at\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`monitoring_ends_at\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`cases\` ADD \`monitoring_reminded_at\` datetime(3) NULL`);
        await queryRunner.query(`ALTER TABLE \`photos\` ADD \`work_order_id\` int UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`deadline_policies\` ADD \`monitoring_days\` smallint UNSIGNED NOT NULL DEFAULT '21'`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`deadline_policies\` DROP COLUMN \`monitoring_days\``);
        await queryRunner.query(`ALTER TABLE \`photos\` DROP COLUMN \`work_order_id\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`monitoring_reminded_at\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`monitoring_ends_at\``);
        await queryRunner.query(`ALTER TABLE \`cases\` DROP COLUMN \`works_done_at\``);
        await queryRunner.query(`DROP INDEX \`idx_work_orders_case\` ON \`work_orders\``);
        await queryRunner.query(`DROP INDEX \`idx_work_orders_org_status\` ON \`work_orders\``);
        await queryRunner.query(`DROP INDEX \`idx_work_orders_org_assignee\` ON \`work_orders\``);
        await queryRunner.query(`DROP TABLE \`work_orders\``);
        await queryRunner.query(`DROP INDEX \`uq_operative_slots\` ON \`operative_slots\``);
        await queryRunner.query(`DROP INDEX \`idx_operative_slots_booking\` ON \`operative_slots\``);
        await queryRunner.query(`DROP TABLE \`operative_slots\``);
        await queryRunner.query(`DROP INDEX \`idx_contractors_org\` ON \`contractors\``);
        await queryRunner.query(`DROP TABLE \`contractors\``);
        await queryRunner.query(`DROP INDEX \`idx_bookings_work_order\` ON \`work_order_bookings\``);
        await queryRunner.query(`DROP TABLE \`work_order_bookings\``);
    }

}
