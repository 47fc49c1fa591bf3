// The queue's text search (GET /api/cases?q=…): the homes it finds by their three-character pieces
// (property_search_grams: kept by triggers, or late for a stock import's homes, which wait in a backlog)
// are exactly those the plain LIKE over every home finds, whatever the case, accents, position in a word
// or spaces in a postcode; they follow a home's address when it changes or goes, and a stock import's
// homes are found before their pieces are written and after.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Property } from "../../server/modules/properties/property.entity.js";
import { StockImportService } from "../../server/modules/properties/stock-import.service.js";
import type { Actor } from "../../server/lib/actor.js";
import { makeLandlord, makeProperty, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { msAgo, testClock } from "../support/test-clock.js";

let t: TestApp;
let officer: Client;
let org: Awaited<ReturnType<typeof makeLandlord>>["org"];
const homes: Record<string, number> = {};
const cases: Record<string, number> = {};
const dir = mkdtempSync(path.join(tmpdir(), "dewline-search-test-"));
let admin: Actor;
let service: StockImportService;

const count = async (sql: string, params: unknown[]) =>
  Number(((await t.ctx.dataSource.query(sql, params)) as { n: string }[])[0]!.n);
const piecesOf = (propertyId: number) =>
  count("SELECT COUNT(*) AS n FROM property_search_grams WHERE property_id = ?", [propertyId]);
const backlogOf = (organisationId: number) =>
  count("SELECT COUNT(*) AS n FROM property_search_backlog WHERE organisation_id = ?", [organisationId]);

/** A case reported by phone for the home, listed under `key`. */
async function addCase(key: string, propertyId: number): Promise<void> {
  homes[key] = propertyId;
  cases[key] = (
    await officer
      .post("/api/cases", {
        channel: "phone",
        awareAt: msAgo(3_600_000).toISOString(),
        propertyId,
        description: "Black mould behind the wardrobe.",
        locations: ["ceiling"],
        observations: ["mould-spots"],
      })
      .expect(201)
  ).body.id;
}

/** The cases the search lists, as the keys of their homes, sorted. */
async function found(q: string): Promise<string[]> {
  const res = await officer.get(`/api/cases?pageSize=100&q=${encodeURIComponent(q)}`).expect(200);
  const ids = (res.body.items as { id: number }[]).map((i) => i.id);
  return Object.keys(cases)
    .filter((k) => ids.includes(cases[k]!))
    .sort();
}

/** What the plain LIKE over every home of the landlord finds for the same text (the search's meaning). */
async function byLike(q: string): Promise<string[]> {
  const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const compact = `%${q.replace(/\s+/g, "").replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const rows = (await t.ctx.dataSource.query(
    "SELECT id FROM properties WHERE organisation_id = ? AND (address_line1 LIKE ? OR town LIKE ? OR REPLACE(postcode, ' ', '') LIKE ?)",
    [org.id, like, like, compact],
  )) as { id: number }[];
  const ids = rows.map((r) => Number(r.id));
  return Object.keys(homes)
    .filter((k) => ids.includes(homes[k]!))
    .sort();
}

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  const landlord = await makeLandlord(ds);
  org = landlord.org;
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  const a = landlord.admin;
  admin = { id: a.id, email: a.email, name: a.name, role: "admin", organisationId: org.id };
  service = new StockImportService(ds, testClock);
  const add = async (key: string, over: Partial<Property>) =>
    addCase(key, (await makeProperty(ds, org, { estate: "Search Test", ...over })).id);
  await add("larkspur", { addressLine1: "4 Larkspur Walk", town: "Corrowby", postcode: "ZQ1 2AB" });
  await add("tansy", { addressLine1: "17 Tansy Close", town: "Corrowby", postcode: "ZQ1 7XY" });
  await add("welsh", { addressLine1: "Tŷ Gwyn, 3 Heol Glan", town: "Llanfair", postcode: "ZW4 9CD" });
  await add("flat", { addressLine1: "Flat 12_B, Oriel Court", town: "Halvering", postcode: "ZQ12 3EF" });
});
afterAll(async () => {
  await t.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("the queue's text search", () => {
  it.each([
    ["a whole street name", "Larkspur"],
    ["part of a word, in the middle", "arkspu"],
    ["another case of letters", "lARKSPUR walk"],
    ["a town", "corrowby"],
    ["a postcode as written", "ZQ1 2AB"],
    ["a postcode without its space", "zq12ab"],
    ["a postcode with spaces in odd places", "Z Q 1 2 A B"],
    ["text without its accent", "Ty Gwyn"],
    ["text with its accent", "tŷ gw"],
    ["a literal underscore", "12_B"],
    ["an underscore that is not there", "Tansy_Close"],
    ["two characters (every home is tested)", "ZQ"],
    ["a house number and street", "17 Tansy"],
    ["text no home holds", "Quillon"],
    ["text whose pieces are all there but not together", "Walkspur"],
  ])("finds the same homes as testing every home, for %s", async (_what, q) => {
    expect(await found(q)).toEqual(await byLike(q));
  });

  it("finds what it should, not only what the plain test finds", async () => {
    expect(await found("arkspu")).toEqual(["larkspur"]);
    expect(await found("Ty Gwyn")).toEqual(["welsh"]);
    expect(await found("zq12ab")).toEqual(["larkspur"]);
    expect(await found("Walkspur")).toEqual([]);
  });

  it("follows a home's new address, and forgets the old one", async () => {
    const repo = t.ctx.dataSource.getRepository(Property);
    await repo.update(homes.tansy!, { addressLine1: "17 Yarrow Close" });
    expect(await found("Yarrow")).toEqual(["tansy"]);
    expect(await found("Tansy")).toEqual([]);
    // A change elsewhere in the row keeps the pieces.
    await repo.update(homes.tansy!, { estate: "Renamed Estate" });
    expect(await found("Yarrow")).toEqual(["tansy"]);
  });

  it("keeps no pieces of a home that is removed", async () => {
    const ds = t.ctx.dataSource;
    const spare = await makeProperty(ds, org, { addressLine1: "9 Quillon Row" });
    expect(await piecesOf(spare.id)).toBeGreaterThan(0);
    await ds.query("DELETE FROM rooms WHERE property_id = ?", [spare.id]);
    await ds.getRepository(Property).delete(spare.id);
    expect(await piecesOf(spare.id)).toBe(0);
  });

  it("finds a stock import's homes at once, and still after their pieces are written in the background", async () => {
    const ds = t.ctx.dataSource;
    const file = path.join(dir, "register.csv");
    writeFileSync(
      file,
      [
        "UPRN,Address 1,Town,Postcode,Property type,Walls,Glazing,Heating",
        "100099001001,3 Hawthorn Rise,Corrowby,ZQ9 1HR,Flat,Solid brick,Single,Gas boiler",
        "100099001002,5 Hawthorn Rise,Corrowby,ZQ9 1HS,Flat,Solid brick,Single,Gas boiler",
      ].join("\n"),
    );
    await service.import(admin, { filePath: file, fileName: "register.csv" });
    const imported = (await ds.query(
      "SELECT id, uprn FROM properties WHERE organisation_id = ? AND uprn LIKE '1000990010%' ORDER BY uprn",
      [org.id],
    )) as { id: number; uprn: string }[];
    expect(imported).toHaveLength(2);
    // The import wrote no pieces: its homes wait in the backlog, and the search tests them one by one.
    expect(await piecesOf(imported[0]!.id)).toBe(0);
    expect(await backlogOf(org.id)).toBeGreaterThan(0);
    for (const [i, home] of imported.entries()) await addCase(`hawthorn${i}`, home.id);
    expect(await found("Hawthorn")).toEqual(["hawthorn0", "hawthorn1"]);
    expect(await found("zq91hs")).toEqual(["hawthorn1"]);

    // The background job writes their pieces and empties the backlog; the search finds the same.
    await t.ctx.services.homeSearch.catchUp();
    expect(await backlogOf(org.id)).toBe(0);
    expect(await piecesOf(imported[0]!.id)).toBeGreaterThan(0);
    expect(await found("Hawthorn")).toEqual(["hawthorn0", "hawthorn1"]);
    expect(await found("Hawthorn")).toEqual(await byLike("Hawthorn"));

    // A second import changes an address: the home is found by the new one, not the old, before and after catch-up.
    writeFileSync(
      file,
      [
        "UPRN,Address 1,Town,Postcode,Property type,Walls,Glazing,Heating",
        "100099001001,3 Medlar Rise,Corrowby,ZQ9 1HR,Flat,Solid brick,Single,Gas boiler",
      ].join("\n"),
    );
    await service.import(admin, { filePath: file, fileName: "register.csv" });
    expect(await found("Medlar")).toEqual(["hawthorn0"]);
    expect(await found("Hawthorn")).toEqual(["hawthorn1"]);
    await t.ctx.services.homeSearch.catchUp();
    expect(await backlogOf(org.id)).toBe(0);
    expect(await found("Medlar")).toEqual(["hawthorn0"]);
    expect(await found("Hawthorn")).toEqual(["hawthorn1"]);
  });

  it("clears the import's session flag, so the connection's next homes get their pieces at once", async () => {
    // Every connection of the pool: none may still carry the flag after the imports above.
    const flags = (await Promise.all(
      Array.from({ length: 10 }, () => t.ctx.dataSource.query("SELECT @dewline_bulk_homes AS flag")),
    )) as { flag: unknown }[][];
    expect(flags.map((r) => r[0]!.flag)).toEqual(Array(10).fill(null));
  });
});
