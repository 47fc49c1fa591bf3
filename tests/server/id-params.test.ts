// Ids in paths and query strings are read in one canonical form only: "0x1b" or "27.0" is not case 27.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let tenant: Client;
let officer: Client;
let admin: Client;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let caseId: number;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  const report = { description: "Mould in the corner of the bedroom.", locations: ["corner"], observations: ["mould-spots"] };
  caseId = (await tenant.post("/api/cases", report).expect(201)).body.id;
});
afterAll(() => t.close());

/** Other ways of writing the number n that a loose parser reads as n. */
const lookalikes = (n: number) => [
  `0x${n.toString(16)}`,
  `${n}.0`,
  `${n}.`,
  `0${n}`,
  `%2B${n}`,
  `${n}e0`,
  `%20${n}`,
  `${n}%20`,
  `0b${n.toString(2)}`,
];

const expectRefused = async (client: Client, url: (id: string) => string, id: number) => {
  for (const written of lookalikes(id)) {
    const res = await client.get(url(written));
    expect([400, 404], `${url(written)} answered ${res.status}`).toContain(res.status);
  }
};

describe("ids are read strictly", () => {
  it("a case opens at its own id only", async () => {
    await tenant.get(`/api/cases/${caseId}`).expect(200);
    await expectRefused(tenant, (id) => `/api/cases/${id}`, caseId);
    await officer.get(`/api/cases/${caseId}/events`).expect(200);
    await expectRefused(officer, (id) => `/api/cases/${id}/events`, caseId);
    await officer.get(`/api/cases/${caseId}/messages`).expect(200);
    await expectRefused(officer, (id) => `/api/cases/${id}/messages`, caseId);
  });

  it("homes and users, and ids in query strings, too", async () => {
    await officer.get(`/api/properties/${landlord.home.id}`).expect(200);
    await expectRefused(officer, (id) => `/api/properties/${id}`, landlord.home.id);
    await admin.get(`/api/users/${landlord.officer.id}/history`).expect(200);
    await expectRefused(admin, (id) => `/api/users/${id}/history`, landlord.officer.id);
    await officer.get(`/api/work-orders?caseId=${caseId}`).expect(200);
    await expectRefused(officer, (id) => `/api/work-orders?caseId=${id}`, caseId);
  });

  it("an id beyond INT UNSIGNED is refused, not wrapped or rounded", async () => {
    const res = await officer.get("/api/cases/4294967296");
    expect([400, 404]).toContain(res.status);
    expect((await officer.get("/api/cases/99999999999999999999")).status).toBe(400);
  });
});
