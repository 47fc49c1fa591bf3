import { MigrationInterface, QueryRunner } from "typeorm";

export class PolicyEmergencyPhone1796401387060 implements MigrationInterface {
    name = 'PolicyEmergencyPhone1796401387060'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`deadline_policies\` ADD \`emergency_phone\` varchar(32) NULL`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`deadline_policies\` DROP COLUMN \`emergency_phone\``);
    }

}
