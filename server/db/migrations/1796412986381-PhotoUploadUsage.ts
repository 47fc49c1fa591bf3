import { MigrationInterface, QueryRunner } from "typeorm";

export class PhotoUploadUsage1796412986381 implements MigrationInterface {
    name = 'PhotoUploadUsage1796412986381'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`photo_upload_usage\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`user_id\` int UNSIGNED NOT NULL, \`pixels\` bigint UNSIGNED NOT NULL, \`bytes\` bigint UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL, INDEX \`idx_photo_upload_usage_user\` (\`user_id\`, \`created_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP INDEX \`idx_photo_upload_usage_user\` ON \`photo_upload_usage\``);
        await queryRunner.query(`DROP TABLE \`photo_upload_usage\``);
    }

}
