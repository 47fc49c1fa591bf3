// Exports read their rows by keyset (the sort values and id of the last row), never by offset: with a
// page of 2 and many rows sharing a sort value, every row comes exactly once and in the screen's order.
// And the files say what the screens say: stored codes as the screen's words, read back with csv-parse
// and exceljs, with the screen's filters applied.
import type { IncomingMessage } from "node:http";
import { parse as parseCsv } from "csv-parse/sync";
import ExcelJS from "exceljs";
import type request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { keysetPages, type KeysetPage } from "../../server/lib/table-export.js";
import { WORK_ORDER_EXPORT_COLUMNS } from "../../src/lib/contracts/exports.js";
import type { QueueItemResponse } from "../../src/lib/contracts/triage.js";
import type { WorkOrderResponse } from "../../src/lib/contracts/works.js";
import { deadlineStageLabels } from "../../src/lib/labels.js";
import type { Actor } from "../../server/lib/actor.js";
import { makeLandlord, makeProperty, makeUser, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let admin: Client;
let actor: Actor;
let estate: string;
const caseIds: number[] = [];
let inspectedCase: number;
let bedroomId: number;
let kitchenId: number;

const DAY = 86_400_000;
const TIES = 7;

const binary = (res: request.Response, done: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as IncomingMessage;
  const chunks: Buffer[] = [];
  stream.on("data", (c: Buffer) => chunks.push(c));
  stream.on("end", () => done(null, Buffer.concat(chunks)));
};

async function csvRows(c: Client, url: string): Promise<string[][]> {
  const res = await c.get(url).buffer(true).parse(binary).expect(200);
  return parseCsv(res.body as Buffer, { bom: true }) as string[][];
}

async function sheetRows(c: Client, url: string): Promise<unknown[][]> {
  const res = await c.get(url).buffer(true).parse(binary).expect(200);
  const book = new ExcelJS.Workbook();
  await book.xlsx.load(res.body as ArrayBuffer);
  const sheet = book.worksheets[0]!;
  const rows: unknown[][] = [];
  sheet.eachRow((row) => {
    const values: unknown[] = [];
    for (let i = 1; i <= sheet.columnCount; i += 1) values.push(row.getCell(i).value);
    rows.push(values);
  });
  return rows;
}

/** Every page of an export's reading, two rows a page (ties fall across every page boundary). */
async function allPages<T>(fetch: (after: readonly unknown[] | null, limit: number) => Promise<KeysetPage<T>>): Promise<T[]> {
  const out: T[] = [];
  for await (const rows of keysetPages(fetch, 2)) out.push(...rows);
  return out;
}

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  const o = landlord.officer;
  actor = { id: o.id, email: o.email, name: o.name, role: o.role, organisationId: o.organisationId };
  estate = `Lapwing Rise ${landlord.org.id}`;

  const rooms = (await officer.get(`/api/properties/${landlord.home.id}`).expect(200)).body.rooms as {
    id: number;
    kind: string;
  }[];
  bedroomId = rooms.find((r) => r.kind === "bedroom")!.id;
  kitchenId = rooms.find((r) => r.kind === "kitchen")!.id;
  // Cases alike in every sortable figure: the same home, channel, area, room, day and status.
  const awareAt = msAgo(3 * DAY).toISOString();
  for (let i = 0; i < TIES; i += 1) {
    const res = await officer
      .post("/api/cases", {
        channel: "phone",
        propertyId: landlord.home.id,
        description: "Mould in the corner of the bedroom ceiling.",
        locations: ["ceiling"],
        observations: ["mould-spots"],
        awareAt,
        area: "hand",
        vulnerability: [],
        roomIds: [bedroomId],
      })
      .expect(201);
    caseIds.push(res.body.id);
  }
  // One case investigated, with work orders that share their type, priority and target date.
  inspectedCase = caseIds[0]!;
  await officer
    .patch(`/api/cases/${inspectedCase}`, { status: "triaged", hazardClass: "significant", reason: "Mould over the bed." })
    .expect(200);
  await officer
    .post(`/api/cases/${inspectedCase}/inspections`, {
      inspectedAt: msAgo(3_600_000).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "Condensation mould on the bedroom ceiling.",
      roomReadings: [],
    })
    .expect(201);
  for (let i = 0; i < 5; i += 1)
    await officer
      .post(`/api/cases/${inspectedCase}/work-orders`, {
        type: "extractor-fan",
        priority: "urgent",
        description: "Fit a humidistat fan.",
      })
      .expect(201);
  await officer
    .post(`/api/cases/${inspectedCase}/work-orders`, {
      type: "mould-wash",
      priority: "routine",
      description: "Wash the ceiling.",
    })
    .expect(201);

  // Accounts and homes that share their sort values.
  for (let i = 0; i < 5; i += 1) await makeUser(ds, landlord.org, "maintenance", { name: "Sam Same" });
  for (let i = 0; i < 5; i += 1)
    await makeProperty(ds, landlord.org, { estate, addressLine1: "Flat 1, Lapwing Rise", wallType: "filled-cavity" });
  await makeProperty(ds, landlord.org, { estate, addressLine1: "Flat 2, Lapwing Rise", wallType: "unfilled-cavity" });

  await officer
    .post(`/api/cases/${caseIds[1]}/readings`, [
      { roomId: bedroomId, takenAt: msAgo(2 * DAY).toISOString(), airTemperatureC: 17.5, relativeHumidityPct: 81 },
      { roomId: kitchenId, takenAt: msAgo(2 * DAY).toISOString(), airTemperatureC: 19, relativeHumidityPct: 70 },
      { roomId: bedroomId, takenAt: msAgo(DAY).toISOString(), airTemperatureC: 18, relativeHumidityPct: 75 },
    ])
    .expect(201);
});
afterAll(() => t.close());

describe("keyset pages of an export", () => {
  const queueSorts = [
    "sort=priority",
    "sort=priority&order=asc",
    "sort=status&order=desc",
    "sort=channel",
    "sort=rooms&order=desc",
    "sort=mouldIndex",
    "sort=assignee&order=desc",
    "sort=address",
    "sort=due",
    "sort=awareAt&order=desc",
  ];
  it.each(queueSorts)("give every case of the queue once, in the screen's order (%s)", async (sort) => {
    const screen = (await officer.get(`/api/cases?pageSize=200&${sort}`).expect(200)).body;
    const params = Object.fromEntries(new URLSearchParams(sort)) as { sort: "priority"; order?: "asc" | "desc" };
    const rows = await allPages(async (after, limit) => t.ctx.services.queue.listAfter(actor, params, after, limit));
    expect(screen.total).toBeGreaterThanOrEqual(TIES);
    expect(rows.map((r) => r.id)).toEqual(screen.items.map((i: { id: number }) => i.id));
  });

  it.each(["sort=target", "sort=type&order=desc", "sort=priority", "sort=slot", "sort=status&order=desc", "sort=created"])(
    "give every work order once, in the screen's order (%s)",
    async (sort) => {
      const screen = (await officer.get(`/api/work-orders?pageSize=200&${sort}`).expect(200)).body;
      const params = Object.fromEntries(new URLSearchParams(sort)) as { sort: "target"; order?: "asc" | "desc" };
      const rows = await allPages(async (after, limit) =>
        t.ctx.services.works.listAfter(actor, { order: "asc", ...params }, after, limit),
      );
      expect(screen.total).toBe(6);
      expect(rows.map((r) => r.id)).toEqual(screen.items.map((i: { id: number }) => i.id));
    },
  );

  it("give every account and every home once, in the screen's order", async () => {
    const users = (await admin.get("/api/users?pageSize=200").expect(200)).body;
    const userRows = await allPages(async (after, limit) => t.ctx.services.users.listAfter(actor, {}, after, limit));
    expect(users.total).toBeGreaterThan(5);
    expect(userRows.map((u) => u.id)).toEqual(users.items.map((u: { id: number }) => u.id));

    const homes = (await officer.get(`/api/properties?pageSize=200&estate=${encodeURIComponent(estate)}`).expect(200)).body;
    const homeRows = await allPages(async (after, limit) => t.ctx.services.properties.listAfter(actor, { estate }, after, limit));
    expect(homes.total).toBe(6);
    expect(homeRows.map((h) => h.id)).toEqual(homes.items.map((h: { id: number }) => h.id));
  });
});

describe("an exported file says what the screen says", () => {
  it("the queue: staff's status, channel, area, risk and band in words, with the status filter applied", async () => {
    const columns = "columns=status,channel,area,risk,band";
    const csv = await csvRows(officer, `/api/cases/export?status=investigated&${columns}`);
    expect(csv[0]).toEqual(["Reference", "Risk state", "Status", "Channel", "Affected area", "HHSRS"]);
    // Only the one case the filter leaves, as the screen shows it.
    expect(csv.slice(1).map((r) => r.slice(1))).toEqual([["No readings yet", "Investigated", "Phone", "Hand-sized or less", ""]]);
    const sheet = await sheetRows(officer, `/api/cases/export?status=new&format=xlsx&${columns}`);
    expect(sheet).toHaveLength(TIES); // the heading and the other six
    expect(new Set(sheet.slice(1).map((r) => r[2]))).toEqual(new Set(["New"]));
    expect(new Set(sheet.slice(1).map((r) => r[3]))).toEqual(new Set(["Phone"]));
  });

  it("work orders: type, priority, status and filters as on the works page", async () => {
    const sheet = await sheetRows(officer, `/api/work-orders/export?caseId=${inspectedCase}&type=mould-wash&format=xlsx`);
    expect(sheet[0]).toEqual([
      "Reference",
      "Address",
      "Type",
      "Priority",
      "Target date",
      "Status",
      "Operative or contractor",
      "Visit",
      "Raised",
    ]);
    expect(sheet.slice(1).map((r) => [r[2], r[3], r[5]])).toEqual([["Mould wash", "Routine", "To schedule"]]);
    const csv = await csvRows(officer, `/api/work-orders/export?caseId=${inspectedCase}&sort=type&order=desc`);
    expect(csv.slice(1).map((r) => r[2])).toEqual(["Mould wash", ...Array(5).fill("Extractor fan")]);
  });

  it("the queue: the next deadline as the screen says it, time left, stage and London day and time", async () => {
    const screen = (await officer.get("/api/cases?pageSize=200").expect(200)).body.items as QueueItemResponse[];
    const csv = await csvRows(officer, "/api/cases/export?columns=due");
    expect(csv[0]).toEqual(["Reference", "Next deadline"]);
    const byReference = new Map(csv.slice(1).map((r) => [r[0], r[1]]));
    const londonDay = new Intl.DateTimeFormat("en-GB", {
      timeZone: "Europe/London",
      day: "numeric",
      month: "short",
      hour: "2-digit",
      minute: "2-digit",
      timeZoneName: "short",
    });
    const running = screen.filter((i) => i.nextDeadline);
    expect(running.length).toBeGreaterThan(0);
    for (const item of screen) {
      const cell = byReference.get(item.reference ?? `Case ${item.id}`);
      if (!item.nextDeadline) {
        expect(cell).toBe("No deadline running");
        continue;
      }
      const day = londonDay.format(new Date(item.nextDeadline.dueAt));
      const stage = deadlineStageLabels[item.nextDeadline.stage];
      expect(cell).toMatch(/^(Due in|Overdue by) \d+ (days?|hours?|minutes?): /);
      expect(cell).toMatch(new RegExp(`: ${stage}, ${day}$`));
    }
    const sheet = await sheetRows(officer, "/api/cases/export?columns=due&format=xlsx");
    expect(sheet.slice(1).map((r) => r[1])).toEqual(csv.slice(1).map((r) => r[1]));
  });

  it("work orders: every column as the works page shows the order (address, who, visit, raised)", async () => {
    const screen = (await officer.get(`/api/work-orders?pageSize=200&caseId=${inspectedCase}`).expect(200)).body
      .items as WorkOrderResponse[];
    const csv = await csvRows(officer, `/api/work-orders/export?caseId=${inspectedCase}`);
    expect(csv.slice(1)).toEqual(
      screen.map((w) => WORK_ORDER_EXPORT_COLUMNS.map((c) => (c.value(w) === null ? "" : String(c.value(w))))),
    );
    expect(csv[1]![1]).toBe(`${landlord.home.addressLine1}, ${landlord.home.town}, ${landlord.home.postcode}`);
  });

  it("accounts: role and status in words, only the role asked for", async () => {
    const csv = await csvRows(admin, "/api/users/export?role=maintenance");
    expect(csv).toHaveLength(1 + 6);
    expect(new Set(csv.slice(1).map((r) => `${r[2]} / ${r[3]}`))).toEqual(new Set(["Maintenance lead / Active"]));
    const sheet = await sheetRows(admin, "/api/users/export?role=admin&format=xlsx");
    expect(sheet.slice(1).map((r) => r[2])).toEqual(["Administrator"]);
  });

  it("homes: the type, walls, glazing, heating and ventilation in words, in the estate asked for", async () => {
    const csv = await csvRows(officer, `/api/properties/export?estate=${encodeURIComponent(estate)}`);
    expect(csv.slice(1).map((r) => [r[0], r[5], r[6], r[7], r[8]])).toEqual([
      ...Array(5).fill(["Flat 1, Lapwing Rise", "Mid-terrace house", "Cavity wall, filled", "Single glazing", "Gas boiler"]),
      ["Flat 2, Lapwing Rise", "Mid-terrace house", "Cavity wall, not filled", "Single glazing", "Gas boiler"],
    ]);
    const sheet = await sheetRows(officer, `/api/properties/export?estate=${encodeURIComponent(estate)}&format=xlsx`);
    expect(sheet.slice(1).map((r) => r[6])).toEqual([...Array(5).fill("Cavity wall, filled"), "Cavity wall, not filled"]);
  });

  it("a case's readings: where each came from in words, for the room chosen", async () => {
    const csv = await csvRows(officer, `/api/cases/${caseIds[1]}/readings/export?roomId=${bedroomId}`);
    expect(csv.slice(1).map((r) => [r[1], r[2], r[6]])).toEqual([
      ["Bedroom", "17.5", "By hand"],
      ["Bedroom", "18", "By hand"],
    ]);
    const sheet = await sheetRows(officer, `/api/cases/${caseIds[1]}/readings/export?format=xlsx`);
    expect(sheet.slice(1).map((r) => [r[1], r[6]])).toEqual([
      ["Bedroom", "By hand"],
      ["Kitchen", "By hand"],
      ["Bedroom", "By hand"],
    ]);
  });
});
