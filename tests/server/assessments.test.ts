// POST /api/cases/:id/assessments: the server computes score, band and category; versions are kept.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { HhsrsAssessmentRecord } from "../../server/modules/assessments/assessment.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let officer: Client;
let caseId: number;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  caseId = (
    await tenant
      .post("/api/cases", {
        description: "Mould across the bedroom wall.",
        locations: ["external-wall"],
        observations: ["mould-spots"],
      })
      .expect(201)
  ).body.id;
});
afterAll(() => t.close());

describe("HHSRS assessments", () => {
  it("scores by the published formula and keeps every version", async () => {
    // TRADE.md §4 check vector [derived]: L = 3, O = (0, 1.0, 10.0, 89.0) → (1000·1 + 300·10 + 10·89)/3 = 4890/3 = 1630.0, band C, Category 1.
    const first = await officer
      .post(`/api/cases/${caseId}/assessments`, {
        likelihood: 3,
        spread: [0, 1.0, 10.0, 89.0],
        justification: "Extensive mould in a child's bedroom on a cold solid wall.",
      })
      .expect(201);
    expect(first.body).toMatchObject({ version: 1, score: 1630, band: "C", category: 1 });
    // TRADE.md §4 check vector [derived]: L = 100, O = (0, 0.1, 4.6, 95.3) → 2433/100 = 24.33, band H.
    const second = await officer
      .post(`/api/cases/${caseId}/assessments`, {
        likelihood: 100,
        spread: [0, 0.1, 4.6, 95.3],
        justification: "After the mould wash and a new extractor fan the risk is much lower.",
      })
      .expect(201);
    expect(second.body).toMatchObject({ version: 2, score: 24.33, band: "H", category: 2 });
    const list = await officer.get(`/api/cases/${caseId}/assessments`).expect(200);
    expect(list.body.assessments.map((a: { version: number; band: string }) => [a.version, a.band])).toEqual([
      [1, "C"],
      [2, "H"],
    ]);
    const events = (await officer.get(`/api/cases/${caseId}/events`)).body.events.filter(
      (e: { type: string }) => e.type === "hhsrs-assessed",
    );
    expect(events.at(-1)).toMatchObject({ before: { version: 1, band: "C" }, after: { version: 2, band: "H", category: 2 } });
  });

  it("refuses a likelihood off the scale, a spread not totalling 100 and a missing justification, storing nothing", async () => {
    const before = await t.ctx.dataSource.getRepository(HhsrsAssessmentRecord).countBy({ caseId });
    const l = await officer
      .post(`/api/cases/${caseId}/assessments`, {
        likelihood: 7,
        spread: [0, 1.0, 10.0, 89.0],
        justification: "A sentence of reasons.",
      })
      .expect(400);
    expect(l.body.error.details[0].field).toBe("likelihood");
    const s = await officer
      .post(`/api/cases/${caseId}/assessments`, {
        likelihood: 3,
        spread: [0, 1.0, 10.0, 80.0],
        justification: "A sentence of reasons.",
      })
      .expect(400);
    expect(s.body.error.details[0].field).toMatch(/^spread/);
    await officer.post(`/api/cases/${caseId}/assessments`, { likelihood: 3, spread: [0, 1.0, 10.0, 89.0] }).expect(400);
    await officer
      .post(`/api/cases/${caseId}/assessments`, {
        likelihood: "3",
        spread: [0, 1.0, 10.0, 89.0],
        justification: "A sentence of reasons.",
      })
      .expect(400);
    expect(await t.ctx.dataSource.getRepository(HhsrsAssessmentRecord).countBy({ caseId })).toBe(before);
  });

  it("gives tenants 403 and another landlord's staff 404", async () => {
    const body = { likelihood: 3, spread: [0, 1.0, 10.0, 89.0], justification: "A sentence of reasons." };
    await tenant.post(`/api/cases/${caseId}/assessments`, body).expect(403);
    await tenant.get(`/api/cases/${caseId}/assessments`).expect(403);
    const other = await makeLandlord(t.ctx.dataSource);
    const outsider = await signedInClient(t.app, other.officer.email, PASSWORD);
    await outsider.post(`/api/cases/${caseId}/assessments`, body).expect(404);
  });
});
