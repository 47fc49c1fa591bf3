import { MigrationInterface, QueryRunner } from "typeorm";

/** Where homes and estates are (for outdoor weather), and the hours of weather already fetched. */
export class WeatherLocations1796461205317 implements MigrationInterface {
    name = 'WeatherLocations1796461205317'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`properties\` ADD \`latitude\` decimal(8,5) NULL, ADD \`longitude\` decimal(8,5) NULL`);
        await queryRunner.query(`CREATE TABLE \`estate_locations\` (\`organisation_id\` int UNSIGNED NOT NULL, \`estate\` varchar(100) NOT NULL, \`latitude\` decimal(8,5) NOT NULL, \`longitude\` decimal(8,5) NOT NULL, \`updated_at\` datetime(3) NOT NULL, PRIMARY KEY (\`organisation_id\`, \`estate\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`weather_hours\` (\`lat_tenths\` smallint NOT NULL, \`lon_tenths\` smallint NOT NULL, \`hour_at\` datetime(0) NOT NULL, \`temperature_c\` decimal(4,1) NOT NULL, \`relative_humidity_pct\` decimal(4,1) NOT NULL, \`fetched_at\` datetime(3) NOT NULL, PRIMARY KEY (\`lat_tenths\`, \`lon_tenths\`, \`hour_at\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`weather_hours\``);
        await queryRunner.query(`DROP TABLE \`estate_locations\``);
        await queryRunner.query(`ALTER TABLE \`properties\` DROP COLUMN \`longitude\`, DROP COLUMN \`latitude\``);
    }

}
