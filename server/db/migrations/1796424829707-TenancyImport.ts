import { MigrationInterface, QueryRunner } from "typeorm";

export class TenancyImport1796424829707 implements MigrationInterface {
    name = 'TenancyImport1796424829707'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`users\` ADD \`phone\` varchar(40) NULL`);
        await queryRunner.query(`ALTER TABLE \`users\` ADD \`preferred_language\` varchar(35) NULL`);
        await queryRunner.query(`ALTER TABLE \`tenancies\` ADD \`organisation_id\` int UNSIGNED NULL`);
        await queryRunner.query(`ALTER TABLE \`tenancies\` ADD \`reference\` varchar(64) NULL`);
        await queryRunner.query(`ALTER TABLE \`tenancies\` ADD \`access_needs\` text NULL`);
        await queryRunner.query(`ALTER TABLE \`tenancies\` ADD \`household_vulnerability\` text NULL`);
        await queryRunner.query(`CREATE UNIQUE INDEX \`uq_tenancies_org_reference\` ON \`tenancies\` (\`organisation_id\`, \`reference\`)`);
        await queryRunner.query(`CREATE TABLE \`invitation_batches\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`created_by_id\` int UNSIGNED NOT NULL, \`created_at\` datetime(3) NOT NULL, \`last_released_at\` datetime(3) NULL, \`paused_at\` datetime(3) NULL, \`cancelled_at\` datetime(3) NULL, INDEX \`idx_invitation_batches_org\` (\`organisation_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`pending_invitations\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`batch_id\` int UNSIGNED NOT NULL, \`organisation_id\` int UNSIGNED NOT NULL, \`user_id\` int UNSIGNED NULL, \`email\` varchar(190) NOT NULL, \`status\` varchar(20) NOT NULL DEFAULT 'pending', \`released_at\` datetime(3) NULL, INDEX \`idx_pending_invitations_status\` (\`status\`, \`id\`), INDEX \`idx_pending_invitations_batch\` (\`batch_id\`, \`status\`), INDEX \`idx_pending_invitations_org_email\` (\`organisation_id\`, \`email\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TABLE \`tenancy_imports\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`created_by_id\` int UNSIGNED NOT NULL, \`file_name\` varchar(255) NOT NULL, \`created_at\` datetime(3) NOT NULL, \`rows_read\` int UNSIGNED NOT NULL, \`created_count\` int UNSIGNED NOT NULL, \`updated_count\` int UNSIGNED NOT NULL, \`unchanged_count\` int UNSIGNED NOT NULL, \`rejected_count\` int UNSIGNED NOT NULL, \`invitation_batch_id\` int UNSIGNED NULL, \`report\` longtext NOT NULL, INDEX \`idx_tenancy_imports_org\` (\`organisation_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`ALTER TABLE \`invitation_batches\` ADD CONSTRAINT \`FK_502ffaff11eee7625ee5fb5f545\` FOREIGN KEY (\`organisation_id\`) REFERENCES \`organisations\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`invitation_batches\` ADD CONSTRAINT \`FK_f07496d743fac52d385451773a9\` FOREIGN KEY (\`created_by_id\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`pending_invitations\` ADD CONSTRAINT \`FK_2b943c1996b80f9ade900ad5a0f\` FOREIGN KEY (\`batch_id\`) REFERENCES \`invitation_batches\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`pending_invitations\` ADD CONSTRAINT \`FK_93c5131cabbe03f6dc6f9cca438\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`tenancy_imports\` ADD CONSTRAINT \`FK_5ff559d017e42e90056c2f43325\` FOREIGN KEY (\`organisation_id\`) REFERENCES \`organisations\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
        await queryRunner.query(`ALTER TABLE \`tenancy_imports\` ADD CONSTRAINT \`FK_89a43baffdec17bf3a1d2ec55eb\` FOREIGN KEY (\`created_by_id\`) REFERENCES \`users\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`ALTER TABLE \`tenancy_imports\` DROP FOREIGN KEY \`FK_89a43baffdec17bf3a1d2ec55eb\``);
        await queryRunner.query(`ALTER TABLE \`tenancy_imports\` DROP FOREIGN KEY \`FK_5ff559d017e42e90056c2f43325\``);
        await queryRunner.query(`ALTER TABLE \`pending_invitations\` DROP FOREIGN KEY \`FK_93c5131cabbe03f6dc6f9cca438\``);
        await queryRunner.query(`ALTER TABLE \`pending_invitations\` DROP FOREIGN KEY \`FK_2b943c1996b80f9ade900ad5a0f\``);
        await queryRunner.query(`ALTER TABLE \`invitation_batches\` DROP FOREIGN KEY \`FK_f07496d743fac52d385451773a9\``);
        await queryRunner.query(`ALTER TABLE \`invitation_batches\` DROP FOREIGN KEY \`FK_502ffaff11eee7625ee5fb5f545\``);
        await queryRunner.query(`DROP INDEX \`idx_tenancy_imports_org\` ON \`tenancy_imports\``);
        await queryRunner.query(`DROP TABLE \`tenancy_imports\``);
        await queryRunner.query(`DROP INDEX \`idx_pending_invitations_org_email\` ON \`pending_invitations\``);
        await queryRunner.query(`DROP INDEX \`idx_pending_invitations_batch\` ON \`pending_invitations\``);
        await queryRunner.query(`DROP INDEX \`idx_pending_invitations_status\` ON \`pending_invitations\``);
        await queryRunner.query(`DROP TABLE \`pending_invitations\``);
        await queryRunner.query(`DROP INDEX \`idx_invitation_batches_org\` ON \`invitation_batches\``);
        await queryRunner.query(`DROP TABLE \`invitation_batches\``);
        await queryRunner.query(`DROP INDEX \`uq_tenancies_org_reference\` ON \`tenancies\``);
        await queryRunner.query(`ALTER TABLE \`tenancies\` DROP COLUMN \`household_vulnerability\``);
        await queryRunner.query(`ALTER TABLE \`tenancies\` DROP COLUMN \`access_needs\``);
        await queryRunner.query(`ALTER TABLE \`tenancies\` DROP COLUMN \`reference\``);
        await queryRunner.query(`ALTER TABLE \`tenancies\` DROP COLUMN \`organisation_id\``);
        await queryRunner.query(`ALTER TABLE \`users\` DROP COLUMN \`preferred_language\``);
        await queryRunner.query(`ALTER TABLE \`users\` DROP COLUMN \`phone\``);
    }

}
