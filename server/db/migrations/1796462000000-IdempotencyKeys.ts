import { MigrationInterface, QueryRunner } from "typeorm";

/** Idempotency-Key of POSTs that wrote something, recorded with the write, and the answer to replay. */
export class IdempotencyKeys1796462000000 implements MigrationInterface {
    name = 'IdempotencyKeys1796462000000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`idempotency_keys\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`scope_kind\` varchar(16) NOT NULL, \`scope_id\` int UNSIGNED NOT NULL, \`organisation_id\` int UNSIGNED NOT NULL, \`idem_key\` varchar(100) CHARACTER SET "ascii" COLLATE "ascii_bin" NOT NULL, \`method\` varchar(8) NOT NULL, \`path\` varchar(255) NOT NULL, \`request_hash\` char(64) NOT NULL, \`response_status\` smallint UNSIGNED NULL, \`response_body\` longtext NULL, \`body_withheld\` tinyint NOT NULL DEFAULT 0, \`created_at\` datetime(3) NOT NULL, \`responded_at\` datetime(3) NULL, INDEX \`idx_idempotency_keys_created\` (\`created_at\`), UNIQUE INDEX \`uq_idempotency_keys_scope_key\` (\`scope_kind\`, \`scope_id\`, \`idem_key\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`uq_idempotency_keys_scope_key\` ON \`idempotency_keys\``);
        await queryRunner.query(`DROP INDEX \`idx_idempotency_keys_created\` ON \`idempotency_keys\``);
        await queryRunner.query(`DROP TABLE \`idempotency_keys\``);
    }

}
