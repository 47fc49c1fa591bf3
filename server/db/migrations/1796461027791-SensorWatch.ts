import { MigrationInterface, QueryRunner } from "typeorm";

/** Rooms' live sensor figures, the alerts raised on them, and each landlord's alert rules. */
export class SensorWatch1796461027791 implements MigrationInterface {
    name = 'SensorWatch1796461027791'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`sensor_room_figures\` (\`room_id\` int UNSIGNED NOT NULL, \`organisation_id\` int UNSIGNED NOT NULL, \`property_id\` int UNSIGNED NOT NULL, \`sensor_id\` int UNSIGNED NOT NULL, \`surface_basis\` varchar(10) NOT NULL, \`hours_at_80_7d\` double NOT NULL, \`hours_condensing_7d\` double NOT NULL, \`condensing_days_7d\` tinyint UNSIGNED NOT NULL, \`mould_index\` double NOT NULL, \`days\` longtext NOT NULL, \`latest_reading_at\` datetime(0) NOT NULL, \`latest_air_temperature_c\` double NOT NULL, \`latest_relative_humidity_pct\` double NOT NULL, \`latest_surface_rh_pct\` double NOT NULL, \`computed_at\` datetime(3) NOT NULL, INDEX \`idx_sensor_room_figures_property\` (\`property_id\`), PRIMARY KEY (\`room_id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`sensor_alerts\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`property_id\` int UNSIGNED NOT NULL, \`room_id\` int UNSIGNED NOT NULL, \`sensor_id\` int UNSIGNED NOT NULL, \`rule\` varchar(20) NOT NULL, \`raised_at\` datetime(0) NOT NULL, \`figures\` longtext NOT NULL, \`state\` varchar(14) NOT NULL DEFAULT 'open', \`case_id\` int UNSIGNED NULL, \`dismissed_reason\` varchar(500) NULL, \`closed_by_id\` int UNSIGNED NULL, \`closed_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL, \`version\` int NOT NULL DEFAULT '1', UNIQUE INDEX \`uq_sensor_alerts_room_rule_hour\` (\`room_id\`, \`rule\`, \`raised_at\`), INDEX \`idx_sensor_alerts_org_state\` (\`organisation_id\`, \`state\`, \`raised_at\`), INDEX \`idx_sensor_alerts_property\` (\`property_id\`), INDEX \`idx_sensor_alerts_case\` (\`case_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`sensor_alert_policies\` (\`organisation_id\` int UNSIGNED NOT NULL, \`mould_index_at_least\` decimal(3,1) NOT NULL, \`hours_at_80_in_7_days\` smallint UNSIGNED NOT NULL, \`condensing_days_in_7_days\` tinyint UNSIGNED NOT NULL, \`cooldown_days\` smallint UNSIGNED NOT NULL, \`updated_by_id\` int UNSIGNED NOT NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (\`organisation_id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`sensor_alert_policies\``);
        await queryRunner.query(`DROP TABLE \`sensor_alerts\``);
        await queryRunner.query(`DROP TABLE \`sensor_room_figures\``);
    }

}
