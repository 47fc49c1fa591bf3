// The queue's text search (GET /api/cases?q=…): the homes it finds (once per request, by home id) are
// exactly those the plain LIKE over every home finds, whatever the case, accents, position in a word or
// spaces in a postcode, and they follow a home's address when it changes.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Property } from "../../server/modules/properties/property.entity.js";
import { makeLandlord, makeProperty, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

let t: TestApp;
let officer: Client;
let org: Awaited<ReturnType<typeof makeLandlord>>["org"];
const homes: Record<string, number> = {};
const cases: Record<string, number> = {};

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
  const add = async (key: string, over: Partial<Property>) => {
    const home = await makeProperty(ds, org, { estate: "Search Test", ...over });
    homes[key] = home.id;
    cases[key] = (
      await officer
        .post("/api/cases", {
          channel: "phone",
          awareAt: msAgo(3_600_000).toISOString(),
          propertyId: home.id,
          description: "Black mould behind the wardrobe.",
          locations: ["ceiling"],
          observations: ["mould-spots"],
        })
        .expect(201)
    ).body.id;
  };
  await add("larkspur", { addressLine1: "4 Larkspur Walk", town: "Corrowby", postcode: "ZQ1 2AB" });
  await add("tansy", { addressLine1: "17 Tansy Close", town: "Corrowby", postcode: "ZQ1 7XY" });
  await add("welsh", { addressLine1: "Tŷ Gwyn, 3 Heol Glan", town: "Llanfair", postcode: "ZW4 9CD" });
  await add("flat", { addressLine1: "Flat 12_B, Oriel Court", town: "Halvering", postcode: "ZQ12 3EF" });
});
afterAll(() => t.close());

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
    ["two characters", "ZQ"],
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
  });
});
