import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Leases that let one app instance at a time run each background job (`job_leases`), and the hit
 * counts shared by every instance's rate limits (`rate_limit_hits`). Neither has an entity: both are
 * read and written with single conditional statements (server/lib/job-lease.ts,
 * server/middleware/rate-limit-store.ts).
 */
export class JobLeasesAndRateLimits1796462100000 implements MigrationInterface {
    name = 'JobLeasesAndRateLimits1796462100000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`job_leases\` (\`name\` varchar(100) NOT NULL, \`holder\` varchar(100) NULL, \`token\` varchar(32) NULL, \`expires_at\` datetime(3) NOT NULL, \`last_started_at\` datetime(3) NULL, \`last_finished_at\` datetime(3) NULL, \`last_error\` varchar(1000) NULL, PRIMARY KEY (\`name\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`rate_limit_hits\` (\`hit_key\` varchar(255) NOT NULL, \`hits\` int UNSIGNED NOT NULL, \`reset_at\` datetime(3) NOT NULL, INDEX \`idx_rate_limit_hits_reset_at\` (\`reset_at\`), PRIMARY KEY (\`hit_key\`)) ENGINE=InnoDB`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TABLE \`rate_limit_hits\``);
        await queryRunner.query(`DROP TABLE \`job_leases\``);
    }

}
