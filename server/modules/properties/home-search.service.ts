import type { DataSource } from "typeorm";
import type { Logger } from "../../lib/logger.js";
import { searchPatterns } from "../../lib/sql.js";
import { inTransaction } from "../../lib/transaction.js";

/**
 * Finding a landlord's homes by a piece of their address, town or postcode (the officers' queue search),
 * through the homes' three-character pieces in `property_search_grams` (migration HomeSearchPieces: kept
 * by triggers, late for homes a bulk write put in `property_search_backlog` until catchUp has run).
 * The meaning is always the plain collation-aware LIKE '%text%' over the three columns (the postcode
 * without its spaces); the pieces only narrow which homes are tested with it.
 */

/** At most this many of a search's pieces are looked up: the homes holding them all are few enough to test. */
const MAX_GRAMS = 4;

/** Homes whose pieces catchUp writes per transaction (one backlog step). */
const CATCH_UP_STEP = 2000;

/** The session variable that tells the triggers a bulk write records its homes in the backlog instead. */
export const BULK_HOMES_VARIABLE = "@dewline_bulk_homes";

/**
 * A search text's three-character pieces: none when the text is shorter than three characters. Long
 * text gives MAX_GRAMS of them, spread from its start to its end.
 */
function gramsOf(text: string): string[] {
  const chars = [...text];
  const all = [...new Set(chars.slice(0, Math.max(0, chars.length - 2)).map((_, i) => chars.slice(i, i + 3).join("")))];
  if (all.length <= MAX_GRAMS) return all;
  return Array.from({ length: MAX_GRAMS }, (_, k) => all[Math.round((k * (all.length - 1)) / (MAX_GRAMS - 1))]!);
}

/**
 * The ids of a landlord's homes holding every one of `grams`: one lookup of a piece, joined to the
 * others by the table's key (MariaDB starts from the piece fewest homes hold).
 */
function holdingAll(grams: string[]): { sql: string; params: (organisationId: number) => unknown[] } {
  const joins = grams
    .slice(1)
    .map(
      (_, k) =>
        ` JOIN property_search_grams g${k + 1} ON g${k + 1}.organisation_id = g0.organisation_id AND g${k + 1}.gram = ? AND g${k + 1}.property_id = g0.property_id`,
    )
    .join("");
  return {
    sql: `SELECT g0.property_id FROM property_search_grams g0${joins} WHERE g0.organisation_id = ? AND g0.gram = ?`,
    params: (organisationId) => [...grams.slice(1), organisationId, grams[0]],
  };
}

/** The pieces of the homes `[from, to]` of one landlord, column by column (INSERT IGNORE: pieces held stay). */
const WRITE_GRAMS = ["p.address_line1", "p.town", "REPLACE(p.postcode, ' ', '')"].map(
  (column) =>
    `INSERT IGNORE INTO property_search_grams (organisation_id, gram, property_id) ` +
    `SELECT p.organisation_id, SUBSTRING(${column}, n.seq, 3), p.id FROM properties p ` +
    `JOIN seq_1_to_190 n ON n.seq <= CHAR_LENGTH(${column}) - 2 WHERE p.organisation_id = ? AND p.id BETWEEN ? AND ?`,
);

/** A run of home ids, both ends included. */
export interface IdRange {
  first: number;
  last: number;
}

/** Sorted ids as few runs (a bulk write's ids are mostly consecutive). */
export function idRanges(ids: readonly number[]): IdRange[] {
  const sorted = [...ids].sort((a, b) => a - b);
  const ranges: IdRange[] = [];
  for (const id of sorted) {
    const last = ranges.at(-1);
    if (last && id <= last.last + 1) last.last = Math.max(last.last, id);
    else ranges.push({ first: id, last: id });
  }
  return ranges;
}

/** Anything that runs SQL on the bulk write's own connection (inside its transaction). */
type Sql = (sql: string, params?: unknown[]) => Promise<unknown>;

export class HomeSearchService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly logger?: Logger,
  ) {}

  /**
   * The ids of the landlord's homes whose address, town or postcode hold `q` (the postcode compared
   * without spaces), at most `limit`; null when more match (the caller then joins the homes instead).
   */
  async matching(organisationId: number, q: string, limit: number): Promise<number[] | null> {
    const { like, compact } = searchPatterns(q);
    const test = "(p.address_line1 LIKE ? OR p.town LIKE ? OR REPLACE(p.postcode, ' ', '') LIKE ?)";
    const testParams = [like, like, compact];
    // A home matching the text as typed holds its pieces; one matching on the postcode, the pieces of
    // the text without spaces (the same pieces when it has none).
    const typed = gramsOf(q);
    const spaceless = q.replace(/\s+/g, "") === q ? typed : gramsOf(q.replace(/\s+/g, ""));
    let rows: { id: number | string }[];
    if (typed.length && spaceless.length) {
      const candidates = (spaceless === typed ? [typed] : [typed, spaceless]).map((g) => holdingAll(g));
      // Homes a bulk write left in the backlog are tested whether or not they have pieces yet.
      const backlog =
        "SELECT bp.id FROM property_search_backlog b JOIN properties bp FORCE INDEX (PRIMARY) ON bp.organisation_id = b.organisation_id " +
        "AND bp.id BETWEEN b.first_id AND b.last_id WHERE b.organisation_id = ?";
      // The candidates as a derived table joined to the homes: MariaDB works them out once (an IN over
      // a UNION would be asked again for every home). STRAIGHT_JOIN keeps that order: left to itself,
      // MariaDB read all the landlord's homes and tested each against the candidates (bench:queue's
      // street name, 20 000 homes: ~25 ms, against ~2.5 ms from the candidates). FORCE INDEX: the
      // backlog's runs of ids are ranges of the primary key, not a scan of the landlord's homes.
      rows = (await this.dataSource.query(
        `SELECT STRAIGHT_JOIN DISTINCT p.id AS id FROM (${[...candidates.map((c) => c.sql), backlog].join(" UNION ")}) c ` +
          `INNER JOIN properties p ON p.id = c.property_id WHERE p.organisation_id = ? AND ${test} LIMIT ?`,
        [...candidates.flatMap((c) => c.params(organisationId)), organisationId, organisationId, ...testParams, limit + 1],
      )) as { id: number | string }[];
    } else {
      rows = (await this.dataSource.query(`SELECT p.id AS id FROM properties p WHERE p.organisation_id = ? AND ${test} LIMIT ?`, [
        organisationId,
        ...testParams,
        limit + 1,
      ])) as { id: number | string }[];
    }
    return rows.length > limit ? null : rows.map((r) => Number(r.id));
  }

  /**
   * For a bulk write of homes, on its own connection and inside its transaction: the triggers leave
   * the rows it writes alone, and the runs of ids `wrote()` returns go into the backlog with them (so they are
   * searchable from the commit on, and get their pieces from catchUp). The session variable is cleared
   * whatever happens; a connection on which that fails must not go back to the pool (`clearFailed`).
   */
  async bulkWrite<T>(
    sql: Sql,
    organisationId: number,
    write: () => Promise<{ result: T; wrote: () => Promise<readonly IdRange[]> }>,
  ): Promise<T> {
    await sql(`SET ${BULK_HOMES_VARIABLE} = 1`);
    try {
      const { result, wrote } = await write();
      const ranges = await wrote();
      for (let i = 0; i < ranges.length; i += 1000) {
        const part = ranges.slice(i, i + 1000);
        await sql(
          `INSERT INTO property_search_backlog (organisation_id, first_id, last_id) VALUES ${part.map(() => "(?, ?, ?)").join(", ")}`,
          part.flatMap((r) => [organisationId, r.first, r.last]),
        );
      }
      return result;
    } finally {
      await sql(`SET ${BULK_HOMES_VARIABLE} = NULL`);
    }
  }

  /**
   * Writes the pieces of homes in the backlog, oldest entry first, up to about `maxHomes` ids, one
   * step of CATCH_UP_STEP ids per transaction (the entry shrinks with each step, so a crash loses no
   * more than the step). Each step reads the homes with a shared lock, so an address edited meanwhile
   * waits, and its trigger then writes the new pieces. Returns how many ids it covered.
   */
  async catchUp(maxHomes = 50_000): Promise<number> {
    let covered = 0;
    while (covered < maxHomes) {
      const step = await inTransaction(this.dataSource, async (m) => {
        const [entry] = (await m.query(
          "SELECT id, organisation_id AS org, first_id AS first, last_id AS last FROM property_search_backlog ORDER BY id LIMIT 1 FOR UPDATE",
        )) as { id: number; org: number; first: number; last: number }[];
        if (!entry) return 0;
        const first = Number(entry.first);
        const last = Math.min(Number(entry.last), first + CATCH_UP_STEP - 1);
        await m.query("SELECT id FROM properties WHERE organisation_id = ? AND id BETWEEN ? AND ? LOCK IN SHARE MODE", [
          entry.org,
          first,
          last,
        ]);
        // Pieces of an address the bulk write replaced go; the home's pieces now are written.
        await m.query(
          "DELETE g FROM property_search_grams g JOIN properties p ON p.id = g.property_id WHERE p.organisation_id = ? AND p.id BETWEEN ? AND ?",
          [entry.org, first, last],
        );
        for (const sql of WRITE_GRAMS) await m.query(sql, [entry.org, first, last]);
        if (last >= Number(entry.last)) await m.query("DELETE FROM property_search_backlog WHERE id = ?", [entry.id]);
        else await m.query("UPDATE property_search_backlog SET first_id = ? WHERE id = ?", [last + 1, entry.id]);
        return last - first + 1;
      });
      if (step === 0) break;
      covered += step;
    }
    if (covered) this.logger?.info({ homes: covered }, "home search: pieces written for the backlog");
    return covered;
  }
}
