// Advice for the tenant's own home over the real app and MariaDB: two homes built differently get
// different lists, nobody reads another home's advice, and a tenant who says heating is hard to afford
// sees their landlord's own support route (or neutral wording when the landlord has set none).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { homeAdviceResponse, type HomeAdviceResponse } from "../../src/lib/contracts/home-advice.js";
import { heatingSupportPolicyResponse } from "../../src/lib/contracts/policy.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let oldHomeTenant: Client;
let newHomeTenant: Client;
let officer: Client;
let admin: Client;
let otherOfficer: Client;
let oldHomeCaseId: number;
let newHomeCaseId: number;

const report = {
  description: "Black spots on the bedroom wall",
  locations: ["external-wall"],
  observations: ["mould-spots"],
};
const put = (c: Client, url: string, body: object) => c.agent.put(url).set("X-CSRF-Token", c.csrf).send(body);
const ids = (a: HomeAdviceResponse) => a.items.map((i) => i.id);

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  // The factories' home: solid brick walls, single glazing, a gas boiler.
  landlord = await makeLandlord(ds);
  other = await makeLandlord(ds);
  const newHome = await makeProperty(ds, landlord.org, {
    wallType: "filled-cavity",
    glazingType: "modern-double",
    heatingType: "gas-boiler",
  });
  const newHomeUser = await makeTenant(ds, landlord.org, newHome);
  oldHomeTenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  newHomeTenant = await signedInClient(t.app, newHomeUser.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  otherOfficer = await signedInClient(t.app, other.officer.email, PASSWORD);

  const a = await oldHomeTenant.post("/api/cases", { ...report, equipment: { heatingCost: "hard-to-afford" } }).expect(201);
  oldHomeCaseId = a.body.id;
  expect(a.body.equipment).toEqual({ heatingCost: "hard-to-afford" });
  const b = await newHomeTenant.post("/api/cases", report).expect(201);
  newHomeCaseId = b.body.id;
});
afterAll(async () => {
  await t?.close();
});

describe("advice for the tenant's own home", () => {
  it("single glazing and solid walls get window film and reflector panels; double glazing and a filled cavity do not", async () => {
    const old = homeAdviceResponse.parse((await oldHomeTenant.get(`/api/cases/${oldHomeCaseId}/advice`).expect(200)).body);
    const modern = homeAdviceResponse.parse((await newHomeTenant.get(`/api/cases/${newHomeCaseId}/advice`).expect(200)).body);
    expect(ids(old)).toEqual(
      expect.arrayContaining(["steady-low-heat", "window-film", "radiator-reflector", "draught-proofing"]),
    );
    expect(ids(modern)).toEqual(["steady-low-heat"]);
    for (const a of [old, modern]) {
      expect(a.safety).toMatchObject({ id: "no-oven-for-warmth", cautions: expect.arrayContaining(["co-alarm"]) });
      for (const item of [...a.items, a.safety]) expect(item.source).not.toBe("");
    }
  });

  it("nobody reads another home's advice: another tenant and another landlord's staff get a 404", async () => {
    await newHomeTenant.get(`/api/cases/${oldHomeCaseId}/advice`).expect(404);
    await otherOfficer.get(`/api/cases/${oldHomeCaseId}/advice`).expect(404);
  });

  it("the officer sees the same list the tenant was shown", async () => {
    const tenantView = (await oldHomeTenant.get(`/api/cases/${oldHomeCaseId}/advice`).expect(200)).body;
    const officerView = (await officer.get(`/api/cases/${oldHomeCaseId}/advice`).expect(200)).body;
    expect(officerView).toEqual(tenantView);
  });

  it("a tenant who finds heating hard to afford sees the landlord's route, or neutral wording before it is set", async () => {
    const before = homeAdviceResponse.parse((await oldHomeTenant.get(`/api/cases/${oldHomeCaseId}/advice`).expect(200)).body);
    expect(before.support).toEqual({ text: null, phone: null, link: null });

    const saved = await put(admin, "/api/policy/heating-support", {
      supportText: "Our money advice team can help with heating bills.",
      supportPhone: "0300 123 4567",
      supportLink: "",
    }).expect(200);
    expect(heatingSupportPolicyResponse.parse(saved.body)).toMatchObject({ source: "landlord", supportLink: null });

    const after = homeAdviceResponse.parse((await oldHomeTenant.get(`/api/cases/${oldHomeCaseId}/advice`).expect(200)).body);
    expect(after.support).toEqual({
      text: "Our money advice team can help with heating bills.",
      phone: "0300 123 4567",
      link: null,
    });
    // A tenant who did not say so is not shown it.
    const modern = homeAdviceResponse.parse((await newHomeTenant.get(`/api/cases/${newHomeCaseId}/advice`).expect(200)).body);
    expect(modern.support).toBeNull();
  });

  it("a bad support route is refused with a clear 400 and changes nothing", async () => {
    await put(admin, "/api/policy/heating-support", { supportText: "Call us.", supportPhone: "12" }).expect(400);
    await put(admin, "/api/policy/heating-support", { supportText: "Call us.", supportLink: "ftp://x" }).expect(400);
    const stored = await officer.get("/api/policy/heating-support").expect(200);
    expect(stored.body.supportText).toBe("Our money advice team can help with heating bills.");
    // Another landlord's setting is its own.
    expect((await otherOfficer.get("/api/policy/heating-support").expect(200)).body.source).toBe("default");
  });

  it("a finished report's advice is not sent to its tenant; the officer still sees what was shown", async () => {
    const b = await newHomeTenant.post("/api/cases", report).expect(201);
    await t.ctx.dataSource.query("UPDATE cases SET status = 'closed' WHERE id = ?", [b.body.id]);
    const refused = await newHomeTenant.get(`/api/cases/${b.body.id}/advice`).expect(404);
    expect(refused.body.error.message).toMatch(/finished or withdrawn/);
    expect(ids(homeAdviceResponse.parse((await officer.get(`/api/cases/${b.body.id}/advice`).expect(200)).body))).toEqual([
      "steady-low-heat",
    ]);
  });

  it("a report with an unknown heating cost answer is refused", async () => {
    await oldHomeTenant.post("/api/cases", { ...report, equipment: { heatingCost: "lots" } }).expect(400);
  });
});
