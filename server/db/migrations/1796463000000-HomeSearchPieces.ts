import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Written by hand. The queue's text search tested every home's address, town and postcode with a
 * collation-aware LIKE '%…%' (8–20 ms for 20 000 homes on every search, bench:queue). MariaDB now keeps
 * each home's three-character pieces ("trigrams") of those columns in `property_search_grams`, and a
 * search of three characters or more tests only the homes holding its pieces, with the same LIKE.
 *
 * The pieces need only hold AT LEAST the pieces of each home's text (candidates are tested again), so
 * they may be late, never missing for a home that is not in `property_search_backlog`:
 * - Everyday writes (a home added or its address edited) keep them by triggers, in the same statement.
 * - A bulk write (the stock import) sets the session variable @dewline_bulk_homes, so the triggers
 *   leave its rows alone, and records the ids it wrote in `property_search_backlog` in its own
 *   transaction. A leased job writes their pieces later in steps (HomeSearchService.catchUp); until it
 *   has, the search tests the backlog's homes with the plain LIKE. A per-row trigger had made the import
 *   of 100 000 homes take 23 s instead of 1.5 s (bench:stock).
 * The postcode's pieces are taken without its spaces, as the search compares it. A home's pieces are
 * written by one INSERT … SELECT over MariaDB's sequence table (positions 1–190, the longest column).
 * The homes already there go into the backlog, so the migration itself writes no pieces.
 */
const PUT_GRAMS = `
    INSERT IGNORE INTO property_search_grams (organisation_id, gram, property_id)
      SELECT NEW.organisation_id, SUBSTRING(v.s, n.seq, 3), NEW.id
      FROM (SELECT NEW.address_line1 AS s UNION ALL SELECT NEW.town UNION ALL SELECT REPLACE(NEW.postcode, ' ', '')) v
      JOIN seq_1_to_190 n ON n.seq <= CHAR_LENGTH(v.s) - 2;`;
/** An update that leaves the three columns (and the landlord) as they were keeps its pieces. */
const SEARCHED_CHANGED =
  "NOT (NEW.address_line1 <=> OLD.address_line1 AND NEW.town <=> OLD.town AND NEW.postcode <=> OLD.postcode AND NEW.organisation_id <=> OLD.organisation_id)";

export class HomeSearchPieces1796463000000 implements MigrationInterface {
    name = 'HomeSearchPieces1796463000000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`property_search_grams\` (\`organisation_id\` int UNSIGNED NOT NULL, \`gram\` varchar(3) NOT NULL, \`property_id\` int UNSIGNED NOT NULL, PRIMARY KEY (\`organisation_id\`, \`gram\`, \`property_id\`), INDEX \`idx_property_search_grams_property\` (\`property_id\`)) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
        await queryRunner.query(`CREATE TABLE \`property_search_backlog\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`organisation_id\` int UNSIGNED NOT NULL, \`first_id\` int UNSIGNED NOT NULL, \`last_id\` int UNSIGNED NOT NULL, PRIMARY KEY (\`id\`), INDEX \`idx_property_search_backlog_org\` (\`organisation_id\`, \`first_id\`)) ENGINE=InnoDB`);
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_grams_insert\` AFTER INSERT ON \`properties\` FOR EACH ROW BEGIN
  IF @dewline_bulk_homes IS NULL THEN ${PUT_GRAMS}
  END IF;
END`);
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_grams_update\` AFTER UPDATE ON \`properties\` FOR EACH ROW BEGIN
  IF @dewline_bulk_homes IS NULL AND ${SEARCHED_CHANGED} THEN
    DELETE FROM property_search_grams WHERE property_id = NEW.id; ${PUT_GRAMS}
  END IF;
END`);
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_grams_delete\` AFTER DELETE ON \`properties\` FOR EACH ROW DELETE FROM \`property_search_grams\` WHERE \`property_id\` = OLD.\`id\``);
        // The homes already there: one backlog range per landlord.
        await queryRunner.query(`INSERT INTO \`property_search_backlog\` (\`organisation_id\`, \`first_id\`, \`last_id\`) SELECT \`organisation_id\`, MIN(\`id\`), MAX(\`id\`) FROM \`properties\` GROUP BY \`organisation_id\``);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TRIGGER \`trg_properties_grams_delete\``);
        await queryRunner.query(`DROP TRIGGER \`trg_properties_grams_update\``);
        await queryRunner.query(`DROP TRIGGER \`trg_properties_grams_insert\``);
        await queryRunner.query(`DROP TABLE \`property_search_backlog\``);
        await queryRunner.query(`DROP TABLE \`property_search_grams\``);
    }
}
