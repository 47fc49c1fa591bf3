import { afterAll, beforeAll, expect, it } from "vitest";
import { loadConfig } from "../../server/config/env.js";
import { createDataSource } from "../../server/db/create-data-source.js";
import { DEMO_ACCOUNTS, DEMO_ORGANISATION, seedDemo } from "../../server/db/seeds/demo.js";
import { Organisation } from "../../server/modules/organisations/organisation.entity.js";
import { Property } from "../../server/modules/properties/property.entity.js";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { runSeed } from "../../scripts/seed.js";
import { SURFACE_STATES } from "../../src/lib/domain/index.js";
import { createTestApp, signedInClient, type TestApp } from "../support/test-app.js";

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

it("creates the demo landlord once, with about 120 homes on three estates, and the demo accounts sign in", async () => {
  const first = await seedDemo(t.ctx.dataSource, "demo-password-1", t.ctx.clock.now());
  const second = await seedDemo(t.ctx.dataSource, "demo-password-2", t.ctx.clock.now());
  expect(first.created).toBe(true);
  expect(second.created).toBe(false);
  const orgs = await t.ctx.dataSource.getRepository(Organisation).findBy({ name: DEMO_ORGANISATION });
  expect(orgs).toHaveLength(1);
  const homes = await t.ctx.dataSource.getRepository(Property).findBy({ organisationId: orgs[0]!.id });
  expect(homes).toHaveLength(120);
  expect(new Set(homes.map((h) => h.estate)).size).toBe(3);
  expect(homes.some((h) => h.glazingType === "single")).toBe(true);
  expect(homes.some((h) => h.wallType === "filled-cavity")).toBe(true);
  expect(homes.some((h) => h.wallType === "solid-brick")).toBe(true);

  // The second run set the password again; the two demo tenants live in different homes.
  for (const account of DEMO_ACCOUNTS) {
    const me = await (await signedInClient(t.app, account.email, "demo-password-2")).get("/api/auth/me").expect(200);
    expect(me.body.role).toBe(account.role);
  }
  const tenancies = t.ctx.dataSource.getRepository(Tenancy);
  const [a, b] = await Promise.all(
    ["tenant@example.org", "tenant2@example.org"].map(async (email) => {
      const client = await signedInClient(t.app, email, "demo-password-2");
      return (await client.get("/api/me/home").expect(200)).body.property.id as number;
    }),
  );
  expect(a).not.toBe(b);
  expect(await tenancies.countBy({ propertyId: a })).toBe(1);
  expect(first.cases).toBeGreaterThan(20);
  expect(second.cases).toBe(0);
});

it("gives the officer a live queue: open and overdue cases, risk states from readings, an assessed one", async () => {
  const officer = await signedInClient(t.app, "officer@example.org", "demo-password-2");
  const { items, total } = (await officer.get("/api/cases?pageSize=200").expect(200)).body;
  expect(total).toBeGreaterThan(20);
  const open = items.filter((i: { status: string }) => !["closed", "cancelled"].includes(i.status));
  expect(open.length).toBeGreaterThan(15);
  expect(items.some((i: { overdue: boolean; vulnerableHousehold: boolean }) => i.overdue && i.vulnerableHousehold)).toBe(true);
  // Every risk state is one the engine knows (which ones depends on the hour the demo was made: its readings follow "now").
  for (const i of items as { riskState: string | null }[]) expect([...SURFACE_STATES, null]).toContain(i.riskState);
  expect(items.some((i: { riskState: string | null }) => i.riskState === "condensing" || i.riskState === "mould-risk")).toBe(
    true,
  );
  expect(items.some((i: { hhsrs: unknown }) => i.hhsrs !== null)).toBe(true);
  // The maintenance lead has booked work this week and a case being monitored with readings either side of the works.
  const lead = await signedInClient(t.app, "maintenance@example.org", "demo-password-2");
  const booked = (await lead.get("/api/work-orders?status=scheduled").expect(200)).body;
  expect(booked.total).toBeGreaterThan(0);
  expect(booked.items[0].assignee.name).toBe("Dale Whitcombe");
  const monitoring = items.find(
    (i: { status: string; riskState: string | null }) => i.status === "monitoring" && i.riskState !== null,
  );
  const verification = (await lead.get(`/api/cases/${monitoring.id}/verification`).expect(200)).body;
  expect(["monitoring", "ended"]).toContain(verification.state);
  expect(verification.rooms[0].comparison.before.count).toBeGreaterThan(0);
  expect(verification.rooms[0].comparison.after.count).toBeGreaterThan(0);
  expect(verification.rooms[0].comparison.improved).toBe(true);
  // The two named demo tenants start with no cases of their own, so the walkthrough begins clean.
  const tenant2 = await signedInClient(t.app, "tenant2@example.org", "demo-password-2");
  expect((await tenant2.get("/api/me/cases").expect(200)).body.items).toEqual([]);
});

it("refuses to seed when NODE_ENV=production", async () => {
  const config = { ...loadConfig(), env: "production" as const };
  await expect(runSeed(config)).rejects.toThrow(/production/);
  // Nothing was opened: a DataSource for the same database still initialises and closes normally.
  const ds = createDataSource(config.db);
  await ds.initialize();
  await ds.destroy();
});
