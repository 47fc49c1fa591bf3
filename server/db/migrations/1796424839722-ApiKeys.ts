import { MigrationInterface, QueryRunner } from "typeorm";

export class ApiKeys1796424839722 implements MigrationInterface {
    name = 'ApiKeys1796424839722'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`api_keys\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`name\` varchar(100) NOT NULL, \`scopes\` varchar(200) NOT NULL, \`secret_hash\` char(64) NOT NULL, \`created_by_user_id\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL, \`last_used_at\` datetime(3) NULL, \`revoked_at\` datetime(3) NULL, \`revoked_by_user_id\` int UNSIGNED NULL, INDEX \`idx_api_keys_organisation\` (\`organisation_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`api_key_audit_entries\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`api_key_id\` int UNSIGNED NOT NULL, \`method\` varchar(10) NOT NULL, \`path\` varchar(300) NOT NULL, \`status\` smallint UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL, INDEX \`idx_api_key_audit_key\` (\`api_key_id\`, \`id\`), INDEX \`idx_api_key_audit_organisation\` (\`organisation_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_api_key_audit_organisation\` ON \`api_key_audit_entries\``);
        await queryRunner.query(`DROP INDEX \`idx_api_key_audit_key\` ON \`api_key_audit_entries\``);
        await queryRunner.query(`DROP TABLE \`api_key_audit_entries\``);
        await queryRunner.query(`DROP INDEX \`idx_api_keys_organisation\` ON \`api_keys\``);
        await queryRunner.query(`DROP TABLE \`api_keys\``);
    }

}
