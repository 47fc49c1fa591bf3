import { MigrationInterface, QueryRunner } from "typeorm";

/** Staff's reason for each deadline stage a case missed (one per case and stage). */
export class MissedDeadlineReasons1796448909533 implements MigrationInterface {
    name = 'MissedDeadlineReasons1796448909533'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`missed_deadline_reasons\` (\`case_id\` int UNSIGNED NOT NULL, \`stage\` varchar(20) NOT NULL, \`reason\` text NOT NULL, \`recorded_by_id\` int UNSIGNED NOT NULL, \`recorded_at\` datetime(3) NOT NULL, PRIMARY KEY (\`case_id\`, \`stage\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`missed_deadline_reasons\``);
    }

}
