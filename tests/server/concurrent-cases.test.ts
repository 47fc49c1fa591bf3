// Reports sent at the same moment: several from one tenant, and double submits at many homes.
// Every one is answered 201 with its own reference; none deadlocks into a 500.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Case } from "../../server/modules/cases/case.entity.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
const report = (n: number) => ({
  description: `Black mould behind the wardrobe, report ${n}.`,
  locations: ["behind-furniture"],
  observations: ["mould-spots"],
});

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const statuses = (responses: { status: number }[]) => responses.map((r) => r.status);

describe("reports sent at the same moment", () => {
  it("five at once from one tenant are all accepted, each with its own reference", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const responses = await Promise.all([1, 2, 3, 4, 5].map((n) => tenant.post("/api/cases", report(n))));
    expect(statuses(responses), JSON.stringify(responses.map((r) => r.body))).toEqual([201, 201, 201, 201, 201]);
    const references = responses.map((r) => r.body.reference as string);
    expect(new Set(references).size).toBe(5);
    const rows = await t.ctx.dataSource.getRepository(Case).findBy({ propertyId: landlord.home.id });
    expect(rows).toHaveLength(5);
  });

  it("double submits at ten homes of one landlord, with their officers alerted, are all accepted", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const tenants: Client[] = [await signedInClient(t.app, landlord.tenant.email, PASSWORD)];
    for (let i = 1; i < 10; i++) {
      const home = await makeProperty(t.ctx.dataSource, landlord.org);
      const person = await makeTenant(t.ctx.dataSource, landlord.org, home);
      tenants.push(await signedInClient(t.app, person.email, PASSWORD));
    }
    const vulnerable = { ...report(0), vulnerability: ["children-under-15"] };
    const responses = await Promise.all(
      tenants.flatMap((c) => [c.post("/api/cases", vulnerable), c.post("/api/cases", vulnerable)]),
    );
    expect(statuses(responses), JSON.stringify(responses.filter((r) => r.status !== 201).map((r) => r.body))).toEqual(
      Array(20).fill(201),
    );
    expect(new Set(responses.map((r) => r.body.reference)).size).toBe(20);
  });

  it("staff logging reports for several homes while their tenants report are all accepted", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const awareAt = new Date(Date.UTC(2020, 0, 1)).toISOString();
    const staffReport = { ...report(9), propertyId: landlord.home.id, channel: "phone", awareAt };
    const responses = await Promise.all([
      officer.post("/api/cases", staffReport),
      tenant.post("/api/cases", report(1)),
      officer.post("/api/cases", staffReport),
      tenant.post("/api/cases", report(2)),
    ]);
    expect(statuses(responses), JSON.stringify(responses.map((r) => r.body))).toEqual([201, 201, 201, 201]);
  });
});

describe("changes to one case at the same moment", () => {
  it("messages from the tenant and staff, and worse reports, sent at once are all accepted", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const id = (await tenant.post("/api/cases", report(1)).expect(201)).body.id as number;
    const responses = await Promise.all([
      tenant.post(`/api/cases/${id}/messages`, { body: "The patch is growing.", photoIds: [] }),
      officer.post(`/api/cases/${id}/messages`, { body: "We will call tomorrow.", internal: false }),
      tenant.post(`/api/cases/${id}/messages`, { body: "And it smells.", photoIds: [] }),
      officer.post(`/api/cases/${id}/messages`, { body: "Book a visit.", internal: true }),
      tenant.post(`/api/cases/${id}/worse`, { note: "Now on the ceiling too." }),
      tenant.post(`/api/cases/${id}/messages`, { body: "Please hurry.", photoIds: [] }),
      officer.post(`/api/cases/${id}/messages/read`, {}),
    ]);
    expect(statuses(responses), JSON.stringify(responses.map((r) => r.body))).toEqual([201, 201, 201, 201, 200, 201, 200]);
    const messages = await officer.get(`/api/cases/${id}/messages`).expect(200);
    expect(messages.body.messages).toHaveLength(5);
  });
});
