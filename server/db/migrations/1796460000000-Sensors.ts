import { MigrationInterface, QueryRunner } from "typeorm";

/** Sensors fitted in rooms, with their hashed credentials, and the readings they send. */
export class Sensors1796460000000 implements MigrationInterface {
    name = 'Sensors1796460000000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`sensors\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`property_id\` int UNSIGNED NOT NULL, \`room_id\` int UNSIGNED NOT NULL, \`serial\` varchar(64) NOT NULL, \`model\` varchar(100) NOT NULL, \`placement\` varchar(200) NOT NULL, \`measures_surface\` tinyint NOT NULL DEFAULT 0, \`interval_s\` int UNSIGNED NOT NULL DEFAULT '900', \`installed_on\` date NOT NULL, \`removed_on\` date NULL, \`mqtt_username\` varchar(40) NOT NULL, \`key_hash\` char(64) NULL, \`mqtt_password_hash\` varchar(255) NULL, \`key_issued_at\` datetime(3) NULL, \`revoked_at\` datetime(3) NULL, \`last_reading_at\` datetime(0) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`version\` int NOT NULL DEFAULT '1', INDEX \`idx_sensors_property\` (\`property_id\`), INDEX \`idx_sensors_room\` (\`room_id\`), UNIQUE INDEX \`uq_sensors_key_hash\` (\`key_hash\`), UNIQUE INDEX \`uq_sensors_mqtt_username\` (\`mqtt_username\`), UNIQUE INDEX \`uq_sensors_org_serial\` (\`organisation_id\`, \`serial\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`sensor_readings\` (\`sensor_id\` int UNSIGNED NOT NULL, \`taken_at\` datetime(0) NOT NULL, \`air_temperature_c\` decimal(5,2) NOT NULL, \`relative_humidity_pct\` decimal(5,2) NOT NULL, \`surface_temperature_c\` decimal(5,2) NULL, \`battery_pct\` tinyint UNSIGNED NULL, \`received_at\` datetime(3) NOT NULL, PRIMARY KEY (\`sensor_id\`, \`taken_at\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`sensor_readings\``);
        await queryRunner.query(`DROP TABLE \`sensors\``);
    }

}
