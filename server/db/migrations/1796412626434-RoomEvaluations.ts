import { MigrationInterface, QueryRunner } from "typeorm";

export class RoomEvaluations1796412626434 implements MigrationInterface {
    name = 'RoomEvaluations1796412626434'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`room_evaluations\` (\`case_id\` int UNSIGNED NOT NULL, \`room_id\` int UNSIGNED NOT NULL, \`readings_version\` int UNSIGNED NOT NULL DEFAULT '0', \`computed_version\` int UNSIGNED NULL, \`params\` varchar(100) NULL, \`result\` longtext NULL, \`computed_at\` datetime(3) NULL, PRIMARY KEY (\`case_id\`, \`room_id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`room_evaluations\``);
    }

}
