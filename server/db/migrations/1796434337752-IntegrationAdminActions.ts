import { MigrationInterface, QueryRunner } from "typeorm";

export class IntegrationAdminActions1796434337752 implements MigrationInterface {
    name = 'IntegrationAdminActions1796434337752'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`integration_admin_actions\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`actor_user_id\` int UNSIGNED NOT NULL, \`action\` varchar(40) NOT NULL, \`subject_id\` int UNSIGNED NOT NULL, \`detail\` varchar(500) NOT NULL, \`created_at\` datetime(3) NOT NULL, INDEX \`idx_integration_admin_actions_organisation\` (\`organisation_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_integration_admin_actions_organisation\` ON \`integration_admin_actions\``);
        await queryRunner.query(`DROP TABLE \`integration_admin_actions\``);
    }

}
