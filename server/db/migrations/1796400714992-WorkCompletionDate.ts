import { MigrationInterface, QueryRunner } from "typeorm";

export class WorkCompletionDate1796400714992 implements MigrationInterface {
    name = 'WorkCompletionDate1796400714992'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`work_orders\` ADD \`done_on\` date NULL`);
        await queryRunner.query(`ALTER TABLE \`work_orders\` ADD \`early_reason\` text NULL`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`work_orders\` DROP COLUMN \`early_reason\``);
        await queryRunner.query(`ALTER TABLE \`work_orders\` DROP COLUMN \`done_on\``);
    }

}
