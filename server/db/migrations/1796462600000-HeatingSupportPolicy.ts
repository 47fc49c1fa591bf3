import type { MigrationInterface, QueryRunner } from "typeorm";

/** The landlord's support route for tenants who find heating hard to afford (home advice, issue 17 point 4). */
export class HeatingSupportPolicy1796462600000 implements MigrationInterface {
  name = "HeatingSupportPolicy1796462600000";

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      "CREATE TABLE `heating_support_policies` (`organisation_id` int UNSIGNED NOT NULL, `support_text` varchar(1000) NOT NULL, `support_phone` varchar(32) NULL, `support_link` varchar(500) NULL, `updated_by_id` int UNSIGNED NOT NULL, `updated_at` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (`organisation_id`)) ENGINE=InnoDB",
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("DROP TABLE `heating_support_policies`");
  }
}
