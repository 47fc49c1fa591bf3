// The queue's totals for status-only views come from counts MariaDB keeps per landlord and status
// (triggers on `cases`, migration CaseStatusCounts). They must equal a real COUNT(*) after reports and
// status changes made at the same moment, and a change rolled back must take its count with it.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const report = (n: number) => ({
  description: `Mould around the window frame, report ${n}.`,
  locations: ["window"],
  observations: ["mould-spots"],
});

/** This landlord's real numbers of cases by status (never other test files' rows). */
async function realCounts(organisationId: number): Promise<Record<string, number>> {
  const rows = (await t.ctx.dataSource.query(
    "SELECT status, COUNT(*) AS n FROM cases WHERE organisation_id = ? GROUP BY status",
    [organisationId],
  )) as { status: string; n: string | number }[];
  return Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
}

async function storedCounts(organisationId: number): Promise<Record<string, number>> {
  const rows = (await t.ctx.dataSource.query(
    "SELECT status, SUM(n) AS n FROM case_status_counts WHERE organisation_id = ? GROUP BY status HAVING SUM(n) <> 0",
    [organisationId],
  )) as { status: string; n: string | number }[];
  return Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
}

const total = async (client: Client, query: string) => (await client.get(`/api/cases?${query}`).expect(200)).body.total as number;

describe("the queue's totals", () => {
  it("match a real count after reports and status changes made at the same moment", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const tenants: Client[] = [await signedInClient(t.app, landlord.tenant.email, PASSWORD)];
    for (let i = 1; i < 4; i++) {
      const home = await makeProperty(t.ctx.dataSource, landlord.org);
      tenants.push(await signedInClient(t.app, (await makeTenant(t.ctx.dataSource, landlord.org, home)).email, PASSWORD));
    }
    const first = await Promise.all(
      tenants.flatMap((c, i) => [c.post("/api/cases", report(i)), c.post("/api/cases", report(i + 10))]),
    );
    expect(first.map((r) => r.status)).toEqual(Array(8).fill(201));
    const ids = first.map((r) => r.body.id as number);

    // Bulk moves in both directions between the same statuses, more reports and queue reads, all at once.
    const moves = await Promise.all([
      officer.post("/api/cases/bulk", { ids: ids.slice(0, 4), status: "triaged", reason: "Seen the photos." }),
      officer.post("/api/cases/bulk", { ids: ids.slice(4, 7), status: "cancelled", reason: "Reported twice." }),
      ...tenants.map((c, i) => c.post("/api/cases", report(i + 20))),
      total(officer, "status=open"),
      total(officer, ""),
    ]);
    expect(moves.slice(0, 2).map((r) => (r as { status: number }).status)).toEqual([200, 200]);
    const again = await Promise.all([
      officer.post("/api/cases/bulk", { ids: ids.slice(0, 2), status: "cancelled", reason: "Withdrawn by the tenant." }),
      officer.post("/api/cases/bulk", { ids: ids.slice(4, 6), status: "triaged", reason: "Reopened: not a duplicate." }),
    ]);
    expect(again.map((r) => r.status)).toEqual([200, 200]);

    const real = await realCounts(landlord.org.id);
    expect(real).toEqual({ new: 1 + 4, triaged: 2 + 2, cancelled: 1 + 2 });
    expect(await storedCounts(landlord.org.id)).toEqual(real);
    expect(await total(officer, "status=open")).toBe(real.new! + real.triaged!);
    expect(await total(officer, "")).toBe(12);
    expect(await total(officer, "status=cancelled")).toBe(3);
    expect(await total(officer, "status=new,cancelled")).toBe(8);
    // A view with another filter counts the rows themselves, and agrees.
    expect(await total(officer, "status=open&vulnerable=false")).toBe(real.new! + real.triaged!);
  }, 120_000);

  it("lose a change that was rolled back", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const id = (await tenant.post("/api/cases", report(1)).expect(201)).body.id as number;
    const runner = t.ctx.dataSource.createQueryRunner();
    try {
      await runner.startTransaction();
      await runner.query("UPDATE cases SET status = 'cancelled' WHERE id = ?", [id]);
      expect(await storedCountsIn(runner, landlord.org.id)).toEqual({ cancelled: 1 });
      await runner.rollbackTransaction();
    } finally {
      await runner.release();
    }
    expect(await storedCounts(landlord.org.id)).toEqual({ new: 1 });
  });
});

async function storedCountsIn(
  runner: { query: (sql: string, params: unknown[]) => Promise<unknown> },
  organisationId: number,
): Promise<Record<string, number>> {
  const rows = (await runner.query(
    "SELECT status, SUM(n) AS n FROM case_status_counts WHERE organisation_id = ? GROUP BY status HAVING SUM(n) <> 0",
    [organisationId],
  )) as { status: string; n: string | number }[];
  return Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
}
