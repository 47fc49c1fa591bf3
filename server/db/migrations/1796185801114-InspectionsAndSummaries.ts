import { MigrationInterface, QueryRunner } from "typeorm";

export class InspectionsAndSummaries1796185801114 implements MigrationInterface {
    name = 'InspectionsAndSummaries1796185801114'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`inspections\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`case_id\` int UNSIGNED NOT NULL, \`inspected_at\` datetime(3) NOT NULL, \`inspector_user_id\` int UNSIGNED NOT NULL, \`cause\` varchar(30) NOT NULL, \`mould_extent\` varchar(20) NOT NULL, \`findings\` text NOT NULL, \`room_readings\` text NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_inspections_case\` (\`case_id\`, \`inspected_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`written_summaries\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`case_id\` int UNSIGNED NOT NULL, \`sender_user_id\` int UNSIGNED NOT NULL, \`body\` text NOT NULL, \`outbox_id\` int UNSIGNED NULL, \`sent_at\` datetime(3) NOT NULL, INDEX \`idx_written_summaries_case\` (\`case_id\`, \`sent_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_written_summaries_case\` ON \`written_summaries\``);
        await queryRunner.query(`DROP TABLE \`written_summaries\``);
        await queryRunner.query(`DROP INDEX \`idx_inspections_case\` ON \`inspections\``);
        await queryRunner.query(`DROP TABLE \`inspections\``);
    }

}
