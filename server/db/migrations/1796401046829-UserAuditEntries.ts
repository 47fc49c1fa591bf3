import { MigrationInterface, QueryRunner } from "typeorm";

export class UserAuditEntries1796401046829 implements MigrationInterface {
    name = 'UserAuditEntries1796401046829'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`user_audit_entries\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`actor_user_id\` int UNSIGNED NOT NULL, \`target_user_id\` int UNSIGNED NOT NULL, \`action\` varchar(40) NOT NULL, \`from_value\` varchar(190) NULL, \`to_value\` varchar(190) NULL, \`created_at\` datetime(3) NOT NULL, INDEX \`idx_user_audit_organisation\` (\`organisation_id\`, \`created_at\`), INDEX \`idx_user_audit_target\` (\`target_user_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_user_audit_target\` ON \`user_audit_entries\``);
        await queryRunner.query(`DROP INDEX \`idx_user_audit_organisation\` ON \`user_audit_entries\``);
        await queryRunner.query(`DROP TABLE \`user_audit_entries\``);
    }

}
