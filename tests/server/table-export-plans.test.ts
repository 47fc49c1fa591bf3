// The exports' keyset page queries, in their default order, read an index in that order: MariaDB's
// EXPLAIN of the very query each service sends (caught from TypeORM's query log) names the index and
// has no filesort, on the first page and deep in the table. Each table holds a few thousand rows of
// the landlord and as many of another, so the plan is the one a real landlord's table gets.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import type { Actor } from "../../server/lib/actor.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type TestApp } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

const ROWS = 3000;

let t: TestApp;
let actor: Actor;
let caseId: number;

interface PlanRow {
  table: string;
  key: string | null;
  Extra: string | null;
}

/** EXPLAIN of the query `run` sends whose SQL matches `which`, with the parameters it was sent with. */
async function planOf(run: () => Promise<unknown>, which: RegExp): Promise<PlanRow[]> {
  const spy = vi.spyOn(t.ctx.dataSource.logger, "logQuery");
  let sent: [string, unknown[] | undefined][];
  try {
    await run();
    sent = spy.mock.calls.map(([sql, params]) => [sql, params as unknown[] | undefined]);
  } finally {
    spy.mockRestore();
  }
  const found = sent.find(([sql]) => which.test(sql));
  if (!found) throw new Error(`no query matching ${String(which)} among:\n${sent.map(([sql]) => sql).join("\n")}`);
  return t.ctx.dataSource.query(`EXPLAIN ${found[0]}`, found[1]);
}

function expectIndexInOrder(plan: PlanRow[], table: string, index: string) {
  expect(plan.find((r) => r.table === table)?.key).toBe(index);
  expect(plan.map((r) => r.Extra ?? "").join(" | ")).not.toMatch(/filesort|temporary/i);
}

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  const landlord = await makeLandlord(ds);
  const other = await makeLandlord(ds);
  const o = landlord.officer;
  actor = { id: o.id, email: o.email, name: o.name, role: o.role, organisationId: o.organisationId };
  const officer = await signedInClient(t.app, o.email, PASSWORD);
  const rooms = (await officer.get(`/api/properties/${landlord.home.id}`).expect(200)).body.rooms as { id: number }[];
  const created = await officer
    .post("/api/cases", {
      channel: "phone",
      propertyId: landlord.home.id,
      description: "Mould on the bathroom ceiling.",
      locations: ["ceiling"],
      observations: ["mould-spots"],
      awareAt: msAgo(86_400_000).toISOString(),
      area: "hand",
      vulnerability: [],
      roomIds: [rooms[0]!.id],
    })
    .expect(201);
  caseId = created.body.id;
  for (const org of [landlord.org.id, other.org.id]) {
    await ds.query(
      `INSERT INTO users (organisation_id, email, name, role, status, password_hash)
       SELECT ?, CONCAT('plan', ?, '-', seq, '@example.test'), CONCAT('Person ', seq MOD 300),
              ELT(seq MOD 3 + 1, 'officer', 'maintenance', 'tenant'), 'active', NULL
       FROM seq_1_to_${ROWS}`,
      [org, org],
    );
    await ds.query(
      `INSERT INTO work_orders (organisation_id, case_id, type, description, room_ids, priority, target_date, status, created_by_id)
       SELECT ?, ?, 'mould-wash', 'Wash the ceiling.', '[]', 'routine', DATE('2026-12-07') + INTERVAL (seq MOD 37) DAY,
              ELT(seq MOD 3 + 1, 'unscheduled', 'done', 'cancelled'), ?
       FROM seq_1_to_${ROWS}`,
      [org, caseId, o.id],
    );
  }
  // A logger in each of two rooms every five minutes.
  for (const [c, room] of [
    [caseId, rooms[0]!.id],
    [caseId, rooms[1]!.id],
  ] as const) {
    await ds.query(
      `INSERT INTO readings (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, source)
       SELECT ?, ?, TIMESTAMP('2026-10-01') + INTERVAL seq * 5 MINUTE, 19, 60, 'import' FROM seq_0_to_${ROWS - 1}`,
      [c, room],
    );
  }
  await ds.query("ANALYZE TABLE users, work_orders, readings");
}, 120_000);

afterAll(async () => {
  await t?.close();
});

describe("an export's page query in the default order reads its index in order, with no filesort", () => {
  it("work orders by target date (first page, and after an order deep in the list)", async () => {
    const works = t.ctx.services.works;
    const first = { sort: "target", order: "asc" } as const;
    expectIndexInOrder(
      await planOf(() => works.listAfter(actor, first, null, 1000), /ORDER BY/),
      "w",
      "idx_work_orders_org_target",
    );
    expectIndexInOrder(
      await planOf(() => works.listAfter(actor, first, ["2026-12-20", 1], 1000), /ORDER BY/),
      "w",
      "idx_work_orders_org_target",
    );
  });

  it("accounts by role and name (first page, and after an account deep in the list)", async () => {
    const users = t.ctx.services.users;
    expectIndexInOrder(await planOf(() => users.listAfter(actor, {}, null, 1000), /ORDER BY/), "u", "idx_users_org_role_name");
    expectIndexInOrder(
      await planOf(() => users.listAfter(actor, {}, ["officer", "Person 150", 1], 1000), /ORDER BY/),
      "u",
      "idx_users_org_role_name",
    );
  });

  it("a case's readings across all rooms by time and room (first page, and after a reading deep in the list)", async () => {
    const readings = t.ctx.services.readings;
    expectIndexInOrder(
      await planOf(() => readings.listAfter(caseId, { limit: 1000 }), /ORDER BY/),
      "readings",
      "idx_readings_case_time_room",
    );
    const [middle] = (await t.ctx.dataSource.query(
      "SELECT taken_at, room_id FROM readings WHERE case_id = ? ORDER BY taken_at, room_id LIMIT 1 OFFSET 2500",
      [caseId],
    )) as { taken_at: Date; room_id: number }[];
    expectIndexInOrder(
      await planOf(
        () => readings.listAfter(caseId, { limit: 1000, after: { takenAt: middle!.taken_at, roomId: middle!.room_id } }),
        /ORDER BY/,
      ),
      "readings",
      "idx_readings_case_time_room",
    );
  });
});
