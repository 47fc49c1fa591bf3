import { MigrationInterface, QueryRunner } from "typeorm";

export class CaseReadMarks1796400825803 implements MigrationInterface {
    name = 'CaseReadMarks1796400825803'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`case_read_marks\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`case_id\` int UNSIGNED NOT NULL, \`user_id\` int UNSIGNED NOT NULL, \`up_to_event_id\` bigint UNSIGNED NOT NULL, \`read_at\` datetime(3) NOT NULL, INDEX \`idx_case_read_marks_user\` (\`user_id\`, \`case_id\`), UNIQUE INDEX \`uq_case_read_marks\` (\`case_id\`, \`user_id\`, \`up_to_event_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`uq_case_read_marks\` ON \`case_read_marks\``);
        await queryRunner.query(`DROP INDEX \`idx_case_read_marks_user\` ON \`case_read_marks\``);
        await queryRunner.query(`DROP TABLE \`case_read_marks\``);
    }

}
