import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * Written by hand. The queue's text search found its homes by testing every home's address, town and
 * postcode with a collation-aware LIKE '%…%': 8–20 ms for 20 000 homes on every search (bench:queue),
 * growing with the stock. MariaDB now keeps each home's three-character pieces ("trigrams") of those
 * three columns in `property_search_grams`, by triggers, in the same statement as the home's row (so
 * stock imports, LOAD DATA and hand-run UPDATEs keep it too). A search of three characters or more
 * looks up the homes holding its pieces, then tests only those with the same LIKE as before: the same
 * homes are found (a LIKE match holds every piece of the text, compared by the same collation), in a
 * few milliseconds. The postcode's pieces are taken without its spaces, as the search compares it.
 * A home's pieces are written by one INSERT … SELECT over MariaDB's sequence table (positions 1–190,
 * the longest column): one statement per home, not one per piece.
 */
const PUT_GRAMS = `
  INSERT IGNORE INTO property_search_grams (organisation_id, gram, property_id)
    SELECT NEW.organisation_id, SUBSTRING(v.s, n.seq, 3), NEW.id
    FROM (SELECT NEW.address_line1 AS s UNION ALL SELECT NEW.town UNION ALL SELECT REPLACE(NEW.postcode, ' ', '')) v
    JOIN seq_1_to_190 n ON n.seq <= CHAR_LENGTH(v.s) - 2;`;
/** An update that leaves the three columns (and the landlord) as they were keeps its pieces. */
const SEARCHED_CHANGED =
  "NOT (NEW.address_line1 <=> OLD.address_line1 AND NEW.town <=> OLD.town AND NEW.postcode <=> OLD.postcode AND NEW.organisation_id <=> OLD.organisation_id)";

export class PropertySearchGrams1796462500000 implements MigrationInterface {
    name = 'PropertySearchGrams1796462500000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`CREATE TABLE \`property_search_grams\` (\`organisation_id\` int UNSIGNED NOT NULL, \`gram\` varchar(3) NOT NULL, \`property_id\` int UNSIGNED NOT NULL, PRIMARY KEY (\`organisation_id\`, \`gram\`, \`property_id\`), INDEX \`idx_property_search_grams_property\` (\`property_id\`)) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_grams_insert\` AFTER INSERT ON \`properties\` FOR EACH ROW BEGIN ${PUT_GRAMS}
END`);
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_grams_update\` AFTER UPDATE ON \`properties\` FOR EACH ROW BEGIN
  IF ${SEARCHED_CHANGED} THEN
    DELETE FROM property_search_grams WHERE property_id = NEW.id; ${PUT_GRAMS}
  END IF;
END`);
        await queryRunner.query(`CREATE TRIGGER \`trg_properties_grams_delete\` AFTER DELETE ON \`properties\` FOR EACH ROW DELETE FROM \`property_search_grams\` WHERE \`property_id\` = OLD.\`id\``);
        // The homes already there, column by column.
        for (const column of ["p.address_line1", "p.town", "REPLACE(p.postcode, ' ', '')"]) {
            await queryRunner.query(`INSERT IGNORE INTO \`property_search_grams\` (\`organisation_id\`, \`gram\`, \`property_id\`) SELECT p.organisation_id, SUBSTRING(${column}, n.seq, 3), p.id FROM \`properties\` p JOIN seq_1_to_190 n ON n.seq <= CHAR_LENGTH(${column}) - 2`);
        }
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query(`DROP TRIGGER \`trg_properties_grams_delete\``);
        await queryRunner.query(`DROP TRIGGER \`trg_properties_grams_update\``);
        await queryRunner.query(`DROP TRIGGER \`trg_properties_grams_insert\``);
        await queryRunner.query(`DROP TABLE \`property_search_grams\``);
    }
}
