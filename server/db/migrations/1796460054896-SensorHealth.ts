import { MigrationInterface, QueryRunner } from "typeorm";

/** Each sensor's last health check from its readings (offline is worked out from sensors.last_reading_at at once). */
export class SensorHealth1796460054896 implements MigrationInterface {
    name = 'SensorHealth1796460054896'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`sensor_health\` (\`sensor_id\` int UNSIGNED NOT NULL, \`readings_through\` datetime(0) NULL, \`evaluated_at\` datetime(3) NOT NULL, \`low_battery_since\` datetime(0) NULL, \`low_battery_reason\` varchar(300) NULL, \`flat_since\` datetime(0) NULL, \`flat_reason\` varchar(300) NULL, \`jump_since\` datetime(0) NULL, \`jump_reason\` varchar(300) NULL, INDEX \`idx_sensor_health_evaluated\` (\`evaluated_at\`), PRIMARY KEY (\`sensor_id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`sensor_health\``);
    }

}
