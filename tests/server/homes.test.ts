// Homes for staff: the natural order of addresses, search by estate, a home's page (tenants, cases,
// readings), admins adding and editing homes and rooms, and a report logged by staff from a phone call.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Room } from "../../server/modules/properties/room.entity.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { daysAgo, hoursAgo, msAgo } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let admin: Client;
let tenant: Client;
let otherAdmin: Client;
let estate: string;

const del = (c: Client, url: string) => c.agent.delete(url).set("X-CSRF-Token", c.csrf);

const newHome = (over: object = {}) => ({
  addressLine1: "Flat 7, Wren House",
  addressLine2: null,
  town: "Testford",
  postcode: "zx1  9ab",
  uprn: "",
  estate,
  block: "Wren House",
  builtForm: "flat",
  wallType: "system-built",
  glazingType: "old-double",
  heatingType: "electric-storage",
  ventilation: "extract-fans",
  rooms: [
    { name: "Living room", kind: "living" },
    { name: "Bedroom", kind: "bedroom" },
  ],
  ...over,
});

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  other = await makeLandlord(ds);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  otherAdmin = await signedInClient(t.app, other.admin.email, PASSWORD);
  estate = `Nuthatch Gardens ${landlord.org.id}`;
  // Written in an order that is neither natural nor alphabetical.
  for (const n of [10, 2, 1, 11, 3]) {
    await makeProperty(ds, landlord.org, { addressLine1: `Flat ${n}, Birch House`, block: "Birch House", estate });
  }
});
afterAll(() => t.close());

describe("the Homes list", () => {
  it("lists flats by their number, not as text, and keeps that order after an edit", async () => {
    const list = async () =>
      (await officer.get(`/api/properties?estate=${encodeURIComponent(estate)}`).expect(200)).body.items.map(
        (h: { addressLine1: string }) => h.addressLine1,
      );
    expect(await list()).toEqual([
      "Flat 1, Birch House",
      "Flat 2, Birch House",
      "Flat 3, Birch House",
      "Flat 10, Birch House",
      "Flat 11, Birch House",
    ]);
    const flat11 = (await officer.get(`/api/properties?q=${encodeURIComponent("Flat 11, Birch")}`).expect(200)).body.items[0];
    await admin.patch(`/api/properties/${flat11.id}`, { addressLine1: "Flat 4, Birch House" }).expect(200);
    expect(await list()).toEqual([
      "Flat 1, Birch House",
      "Flat 2, Birch House",
      "Flat 3, Birch House",
      "Flat 4, Birch House",
      "Flat 10, Birch House",
    ]);
  });

  it("finds homes by the estate's name, and never another landlord's", async () => {
    const res = await officer.get(`/api/properties?q=${encodeURIComponent("Nuthatch Gard")}&pageSize=50`).expect(200);
    expect(res.body.total).toBe(5);
    expect(res.body.items.every((h: { estate: string }) => h.estate === estate)).toBe(true);
    const theirs = await otherAdmin.get(`/api/properties?q=${encodeURIComponent("Nuthatch Gard")}`).expect(200);
    expect(theirs.body.total).toBe(0);
  });
});

describe("admins add and edit homes", () => {
  it("adds a home with its rooms, with the postcode tidied and the ventilation kept", async () => {
    const res = await admin.post("/api/properties", newHome()).expect(201);
    expect(res.body).toMatchObject({ postcode: "ZX1 9AB", uprn: null, ventilation: "extract-fans", estate });
    expect(res.body.rooms.map((r: { name: string }) => r.name)).toEqual(["Living room", "Bedroom"]);
    const again = await officer.get(`/api/properties/${res.body.id}`).expect(200);
    expect(again.body.addressLine1).toBe("Flat 7, Wren House");
  });

  it("refuses a bad UPRN or postcode with the field named, and adds nothing", async () => {
    const before = (await officer.get(`/api/properties?estate=${encodeURIComponent(estate)}`)).body.total;
    const uprn = await admin.post("/api/properties", newHome({ uprn: "1234567890123" })).expect(400);
    expect(uprn.body.error.details).toEqual([{ field: "uprn", message: "A UPRN is a number of up to 12 digits." }]);
    const postcode = await admin.post("/api/properties", newHome({ postcode: "NOT A CODE" })).expect(400);
    expect(postcode.body.error.details[0]).toMatchObject({ field: "postcode" });
    expect((await officer.get(`/api/properties?estate=${encodeURIComponent(estate)}`)).body.total).toBe(before);
  });

  it("refuses a UPRN another home of the landlord has, with a 409 naming the field", async () => {
    const uprn = String(700000000000 + landlord.org.id);
    await admin.post("/api/properties", newHome({ addressLine1: "Flat 8, Wren House", uprn })).expect(201);
    const dup = await admin.post("/api/properties", newHome({ addressLine1: "Flat 9, Wren House", uprn })).expect(409);
    expect(dup.body.error.details).toEqual([{ field: "uprn", message: "Another of your homes already has this UPRN." }]);
    // Another landlord may hold the same number for its own home.
    await otherAdmin.post("/api/properties", newHome({ estate: "Elsewhere", uprn })).expect(201);
  });

  it("edits a home's details; only the fields sent change", async () => {
    const home = (await admin.post("/api/properties", newHome({ addressLine1: "Flat 12, Wren House" })).expect(201)).body;
    const res = await admin
      .patch(`/api/properties/${home.id}`, { glazingType: "modern-double", postcode: "zx2 1aa", uprn: "123456789012" })
      .expect(200);
    expect(res.body).toMatchObject({
      glazingType: "modern-double",
      postcode: "ZX2 1AA",
      uprn: "123456789012",
      addressLine1: "Flat 12, Wren House",
      heatingType: "electric-storage",
    });
    const bad = await admin.patch(`/api/properties/${home.id}`, { postcode: "12345" }).expect(400);
    expect(bad.body.error.details[0].field).toBe("postcode");
    expect((await officer.get(`/api/properties/${home.id}`)).body.postcode).toBe("ZX2 1AA");
  });

  it("adds, renames and removes rooms; a room with readings stays, and says why", async () => {
    const home = (await admin.post("/api/properties", newHome({ addressLine1: "Flat 14, Wren House" })).expect(201)).body;
    const added = await admin.post(`/api/properties/${home.id}/rooms`, { name: "Box room", kind: "other" }).expect(201);
    expect(added.body).toMatchObject({ name: "Box room", kind: "other" });
    const renamed = await admin
      .patch(`/api/properties/${home.id}/rooms/${added.body.id}`, { name: "Study", kind: "bedroom" })
      .expect(200);
    expect(renamed.body).toMatchObject({ id: added.body.id, name: "Study", kind: "bedroom" });
    await admin.post(`/api/properties/${home.id}/rooms`, { name: " ", kind: "other" }).expect(400);

    // A reading in the bedroom, through a case logged by the officer.
    const bedroom = home.rooms.find((r: { name: string }) => r.name === "Bedroom");
    const caseId = (
      await officer
        .post("/api/cases", {
          propertyId: home.id,
          channel: "visit",
          awareAt: daysAgo(1).toISOString(),
          description: "Black mould behind the bedroom wardrobe.",
          locations: ["behind-furniture"],
          observations: ["mould-spots"],
        })
        .expect(201)
    ).body.id;
    await officer
      .post(`/api/cases/${caseId}/readings`, [
        { roomId: bedroom.id, takenAt: hoursAgo(5).toISOString(), airTemperatureC: 16, relativeHumidityPct: 78 },
      ])
      .expect(201);

    const refused = await del(admin, `/api/properties/${home.id}/rooms/${bedroom.id}`).expect(409);
    expect(refused.body.error.message).toMatch(/"Bedroom" has 1 reading, so it cannot be removed/);
    await del(admin, `/api/properties/${home.id}/rooms/${added.body.id}`).expect(204);
    const rooms = (await officer.get(`/api/properties/${home.id}`)).body.rooms.map((r: { name: string }) => r.name);
    expect(rooms).toEqual(["Living room", "Bedroom"]);

    const readings = await officer.get(`/api/properties/${home.id}/readings`).expect(200);
    const bedroomReadings = readings.body.rooms.find((r: { room: { id: number } }) => r.room.id === bedroom.id);
    expect(bedroomReadings).toMatchObject({ count: 1, latest: [{ caseId, relativeHumidityPct: 78, airTemperatureC: 16 }] });
    expect(readings.body.rooms.find((r: { room: { name: string } }) => r.room.name === "Living room")).toMatchObject({
      count: 0,
      latest: [],
    });
  });

  it("refuses every write from staff who are not admins (403) and changes nothing", async () => {
    const home = landlord.home;
    await officer.post("/api/properties", newHome()).expect(403);
    await officer.patch(`/api/properties/${home.id}`, { town: "Elsewhere" }).expect(403);
    await officer.post(`/api/properties/${home.id}/rooms`, { name: "Loft", kind: "other" }).expect(403);
    const room = await t.ctx.dataSource.getRepository(Room).findOneByOrFail({ propertyId: home.id, name: "Kitchen" });
    await del(officer, `/api/properties/${home.id}/rooms/${room.id}`).expect(403);
    await tenant.patch(`/api/properties/${home.id}`, { town: "Elsewhere" }).expect(403);
    await tenant.get(`/api/properties/${home.id}/cases`).expect(403);
    const now = (await officer.get(`/api/properties/${home.id}`)).body;
    expect(now.town).toBe("Testford");
    expect(now.rooms.map((r: { name: string }) => r.name)).toEqual(["Bedroom", "Kitchen"]);
  });

  it("answers 404 for another landlord's home, to reads and writes alike", async () => {
    const theirs = other.home;
    const room = await t.ctx.dataSource.getRepository(Room).findOneByOrFail({ propertyId: theirs.id, name: "Kitchen" });
    await admin.patch(`/api/properties/${theirs.id}`, { town: "Mine now" }).expect(404);
    await admin.post(`/api/properties/${theirs.id}/rooms`, { name: "Loft", kind: "other" }).expect(404);
    await admin.patch(`/api/properties/${theirs.id}/rooms/${room.id}`, { name: "Mine" }).expect(404);
    await del(admin, `/api/properties/${theirs.id}/rooms/${room.id}`).expect(404);
    await officer.get(`/api/properties/${theirs.id}`).expect(404);
    await officer.get(`/api/properties/${theirs.id}/tenants`).expect(404);
    await officer.get(`/api/properties/${theirs.id}/cases`).expect(404);
    await officer.get(`/api/properties/${theirs.id}/readings`).expect(404);
    // A room of one of our homes, reached through another landlord's home id, is not found either.
    const ours = await t.ctx.dataSource.getRepository(Room).findOneByOrFail({ propertyId: landlord.home.id, name: "Kitchen" });
    await otherAdmin.patch(`/api/properties/${other.home.id}/rooms/${ours.id}`, { name: "Theirs" }).expect(404);
    expect((await otherAdmin.get(`/api/properties/${theirs.id}`)).body.town).toBe("Testford");
  });
});

describe("staff log a report taken by phone", () => {
  it("creates the case with its channel, awareness date and tenant, and the home's page lists it", async () => {
    const ds = t.ctx.dataSource;
    const home = await makeProperty(ds, landlord.org, { addressLine1: "22 Sedge Lane", estate });
    const resident = await makeTenant(ds, landlord.org, home, { name: "Ash Verlaine" });
    const awareAt = hoursAgo(26).toISOString();
    const res = await officer
      .post("/api/cases", {
        propertyId: home.id,
        channel: "phone",
        awareAt,
        tenantUserId: resident.id,
        description: "Caller says the bathroom ceiling has black spots.",
        locations: ["ceiling"],
        observations: ["mould-spots"],
        since: "weeks",
        equipment: { extractorFanWorks: "no" },
      })
      .expect(201);
    expect(res.body).toMatchObject({ channel: "phone", awareAt, tenantUserId: resident.id, since: "weeks" });
    expect(res.body.reference).toMatch(/^DW-\d{4}-\d{5}$/);

    const cases = await officer.get(`/api/properties/${home.id}/cases`).expect(200);
    expect(cases.body.cases).toEqual([
      expect.objectContaining({
        id: res.body.id,
        channel: "phone",
        awareAt,
        tenantName: "Ash Verlaine",
        status: res.body.status,
      }),
    ]);
    const tenants = await officer.get(`/api/properties/${home.id}/tenants`).expect(200);
    expect(tenants.body.tenants).toEqual([expect.objectContaining({ userId: resident.id, name: "Ash Verlaine", current: true })]);
  });

  it("refuses an awareness date in the future, naming the field, and creates nothing", async () => {
    const home = await makeProperty(t.ctx.dataSource, landlord.org, { addressLine1: "24 Sedge Lane", estate });
    const res = await officer
      .post("/api/cases", {
        propertyId: home.id,
        channel: "letter",
        awareAt: msAgo(-2 * 3_600_000).toISOString(),
        description: "Letter about condensation on every window.",
        locations: ["window"],
        observations: ["condensation"],
      })
      .expect(400);
    expect(res.body.error.details[0].field).toBe("awareAt");
    expect((await officer.get(`/api/properties/${home.id}/cases`)).body.cases).toEqual([]);
  });
});
