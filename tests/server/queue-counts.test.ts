// The queue's totals for status-only views come from counts MariaDB keeps per landlord and status
// (triggers on `cases`, migration CaseStatusCounts). They must equal a real COUNT(*) after reports and
// status changes made at the same moment, and a change rolled back must take its count with it. Deep
// pages in the default order start at their priority from the counts kept per status and priority
// (migration CasePriorityCounts): they must hold the same cases as counting from the top.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { OPEN_STATUSES } from "../../server/modules/cases/case-queue.schemas.js";
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
    expect(await storedPriorityCounts(landlord.org.id)).toEqual(await realPriorityCounts(landlord.org.id));
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

/** This landlord's real numbers of cases by "status priority". */
async function realPriorityCounts(organisationId: number): Promise<Record<string, number>> {
  const rows = (await t.ctx.dataSource.query(
    "SELECT status, priority, COUNT(*) AS n FROM cases WHERE organisation_id = ? GROUP BY status, priority",
    [organisationId],
  )) as { status: string; priority: number; n: string | number }[];
  return Object.fromEntries(rows.map((r) => [`${r.status} ${r.priority}`, Number(r.n)]));
}

async function storedPriorityCounts(organisationId: number): Promise<Record<string, number>> {
  const rows = (await t.ctx.dataSource.query(
    "SELECT status, priority, SUM(n) AS n FROM case_priority_counts WHERE organisation_id = ? GROUP BY status, priority HAVING SUM(n) <> 0",
    [organisationId],
  )) as { status: string; priority: number; n: string | number }[];
  return Object.fromEntries(rows.map((r) => [`${r.status} ${r.priority}`, Number(r.n)]));
}

describe("deep pages of the queue in its default order", () => {
  const COPIES = 3000;
  let organisationId: number;
  let officer: Client;

  beforeAll(async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    organisationId = landlord.org.id;
    officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const id = (await tenant.post("/api/cases", report(1)).expect(201)).body.id as number;
    // Copies of that case with priorities, statuses and deadlines of their own (ties included), on one
    // connection (a temporary table). Their figures are not due, so no refresh moves them meanwhile.
    const runner = t.ctx.dataSource.createQueryRunner();
    try {
      await runner.query(
        `CREATE TEMPORARY TABLE case_copies AS SELECT c.*, s.seq AS n FROM cases c JOIN seq_1_to_${COPIES} s WHERE c.id = ?`,
        [id],
      );
      await runner.query("ALTER TABLE case_copies MODIFY id int NULL");
      await runner.query(
        `UPDATE case_copies SET id = NULL, reference = CONCAT('DW-T', ?, '-', n), triage_due_at = NULL,
           priority = ELT(n MOD 7 + 1, 90, 72, 72, 55, 31, 31, 8) + n MOD 3,
           status = ELT(n MOD 5 + 1, 'new', 'triaged', 'closed', 'cancelled', 'monitoring'),
           next_due_at = IF(n MOD 11 = 0, NULL, TIMESTAMP('2026-11-01') + INTERVAL n MOD 97 DAY)`,
        [organisationId],
      );
      await runner.query("ALTER TABLE case_copies DROP COLUMN n");
      await runner.query("INSERT INTO cases SELECT * FROM case_copies");
      await runner.query("DROP TEMPORARY TABLE case_copies");
    } finally {
      await runner.release();
    }
  }, 120_000);

  /** The ids of one page as counting from the top gives them (a window over every matching case). */
  async function pageFromTop(statuses: readonly string[] | null, desc: boolean, page: number, pageSize: number) {
    const order = desc ? "priority DESC, next_due_at ASC, id ASC" : "priority ASC, next_due_at DESC, id ASC";
    const rows = (await t.ctx.dataSource.query(
      `SELECT id FROM (SELECT id, ROW_NUMBER() OVER (ORDER BY ${order}) AS rn FROM cases WHERE organisation_id = ?` +
        `${statuses ? " AND status IN (?)" : ""}) x WHERE rn > ? AND rn <= ? ORDER BY rn`,
      [organisationId, ...(statuses ? [statuses] : []), (page - 1) * pageSize, page * pageSize],
    )) as { id: number }[];
    return rows.map((r) => Number(r.id));
  }

  const views = [
    { query: "", statuses: null, desc: true },
    { query: "status=open", statuses: OPEN_STATUSES, desc: true },
    { query: "order=asc", statuses: null, desc: false },
    { query: "status=closed,cancelled&order=asc", statuses: ["closed", "cancelled"], desc: false },
  ];

  async function expectSamePages() {
    for (const view of views) {
      for (const [page, pageSize] of [
        [41, 25],
        [45, 25],
        [52, 25],
        [57, 25],
        [60, 25],
        [72, 25],
        [11, 100],
        [15, 100],
        [30, 100],
      ] as const) {
        const res = await officer.get(`/api/cases?${view.query}&page=${page}&pageSize=${pageSize}`).expect(200);
        const ids = (res.body.items as { id: number }[]).map((i) => i.id);
        expect({ view: view.query, page, pageSize, ids }).toEqual({
          view: view.query,
          page,
          pageSize,
          ids: await pageFromTop(view.statuses, view.desc, page, pageSize),
        });
      }
    }
  }

  it("hold the same cases as counting from the top, before and after priorities and statuses change", async () => {
    expect(await storedPriorityCounts(organisationId)).toEqual(await realPriorityCounts(organisationId));
    await expectSamePages();
    // A hand-run UPDATE (not through the services) moves cases between priorities and statuses: the
    // triggers keep the counts, so the pages stay right.
    await t.ctx.dataSource.query(
      "UPDATE cases SET priority = priority + 13, status = IF(id MOD 3 = 0, 'closed', status) WHERE organisation_id = ? AND id MOD 4 = 0",
      [organisationId],
    );
    await t.ctx.dataSource.query("DELETE FROM cases WHERE organisation_id = ? AND id MOD 17 = 0 AND triage_due_at IS NULL", [
      organisationId,
    ]);
    expect(await storedPriorityCounts(organisationId)).toEqual(await realPriorityCounts(organisationId));
    await expectSamePages();
  }, 120_000);
});
