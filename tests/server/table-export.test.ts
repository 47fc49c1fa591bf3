// Exports of the table views (queue, homes, work orders, accounts, a case's readings) as CSV and .xlsx:
// the rows and columns on screen, cells a spreadsheet could run as formulas neutralised, read back with
// independent parsers (csv-parse, exceljs's reader), who may export what, and a large export streamed.
import http, { type IncomingMessage } from "node:http";
import type { AddressInfo } from "node:net";
import { parse as parseCsv } from "csv-parse/sync";
import ExcelJS from "exceljs";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, makeOrganisation, makeProperty, makeUser, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let admin: Client;
let tenant: Client;
let otherAdmin: Client;
let estate: string;
let caseId: number;
let bedroomId: number;

const XLSX_TYPE = "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet";
const DAY = 86_400_000;

/** The body as bytes, whatever its type. */
const bytes = (res: request.Response) => res.body as Buffer;
const binary = (res: request.Response, done: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as IncomingMessage;
  const chunks: Buffer[] = [];
  stream.on("data", (c: Buffer) => chunks.push(c));
  stream.on("end", () => done(null, Buffer.concat(chunks)));
};

async function download(c: Client, url: string): Promise<request.Response> {
  return c.get(url).buffer(true).parse(binary).expect(200);
}

async function csvRows(c: Client, url: string): Promise<string[][]> {
  const res = await download(c, url);
  expect(res.headers["content-type"]).toMatch(/^text\/csv/);
  return parseCsv(bytes(res), { bom: true }) as string[][];
}

async function sheetRows(c: Client, url: string): Promise<ExcelJS.CellValue[][]> {
  const res = await download(c, url);
  expect(res.headers["content-type"]).toBe(XLSX_TYPE);
  const book = new ExcelJS.Workbook();
  await book.xlsx.load(bytes(res) as unknown as ArrayBuffer);
  const sheet = book.worksheets[0]!;
  const rows: ExcelJS.CellValue[][] = [];
  sheet.eachRow((row) => {
    const values: ExcelJS.CellValue[] = [];
    for (let i = 1; i <= sheet.columnCount; i += 1) {
      const cell = row.getCell(i);
      // A formula cell would be an object with a formula: an export must never hold one.
      expect(cell.type).not.toBe(ExcelJS.ValueType.Formula);
      values.push(cell.value);
    }
    rows.push(values);
  });
  return rows;
}

beforeAll(async () => {
  t = await createTestApp();
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  other = await makeLandlord(ds);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  otherAdmin = await signedInClient(t.app, other.admin.email, PASSWORD);
  estate = `Plover Court ${landlord.org.id}`;
  // Written out of order: the export keeps the screen's (estate, then the address's natural order).
  await makeProperty(ds, landlord.org, { estate, addressLine1: "Flat 10, Plover Court", uprn: `0${landlord.org.id}00010` });
  await makeProperty(ds, landlord.org, {
    estate,
    addressLine1: '=HYPERLINK("http://bad.example","Flat 2")',
    addressLine2: "-2+3",
    town: "+Testford",
    block: "@SUM(A1:A9)",
    uprn: `0${landlord.org.id}00002`,
  });
  await makeProperty(ds, landlord.org, { estate, addressLine1: "Flat 1, Plover Court", block: "\tTabbed", uprn: null });
  // The same estate name at another landlord: never in this landlord's export.
  await makeProperty(ds, other.org, { estate, addressLine1: "Flat 3, Plover Court" });

  bedroomId = (await officer.get(`/api/properties/${landlord.home.id}`).expect(200)).body.rooms.find(
    (r: { kind: string }) => r.kind === "bedroom",
  ).id;
  caseId = (
    await officer
      .post("/api/cases", {
        channel: "phone",
        propertyId: landlord.home.id,
        description: "Mould in the corner of the bedroom ceiling.",
        locations: ["ceiling"],
        observations: ["mould-spots"],
        awareAt: msAgo(3 * DAY).toISOString(),
        area: "hand",
        vulnerability: [],
        roomIds: [bedroomId],
      })
      .expect(201)
  ).body.id;
});
afterAll(() => t.close());

describe("exporting the homes list", () => {
  const url = (format: string) =>
    `/api/properties/export?estate=${encodeURIComponent(estate)}&format=${format}&page=2&pageSize=1`;

  it("gives every filtered home as CSV, in the screen's order, with formula-like text neutralised", async () => {
    const res = await download(officer, url("csv"));
    expect(res.headers["content-disposition"]).toMatch(/^attachment; filename="?homes-\d{4}-\d{2}-\d{2}\.csv"?$/);
    const rows = parseCsv(bytes(res), { bom: true }) as string[][];
    expect(rows[0]).toEqual([
      "Address",
      "Town",
      "Postcode",
      "Estate",
      "Block",
      "Type",
      "Walls",
      "Glazing",
      "Heating",
      "Ventilation",
      "UPRN",
    ]);
    // page and pageSize of the screen are ignored: the export holds every page.
    expect(rows.slice(1).map((r) => [r[0], r[1], r[4], r[10]])).toEqual([
      ["Flat 1, Plover Court", "Testford", "'\tTabbed", ""],
      ['\'=HYPERLINK("http://bad.example","Flat 2"), -2+3', "'+Testford", "'@SUM(A1:A9)", `0${landlord.org.id}00002`],
      ["Flat 10, Plover Court", "Testford", "", `0${landlord.org.id}00010`],
    ]);
  });

  it("gives the same rows as .xlsx, formula-like text as plain text and the UPRN as text", async () => {
    const rows = await sheetRows(officer, url("xlsx"));
    expect(rows[0]?.[0]).toBe("Address");
    expect(rows.slice(1).map((r) => [r[0], r[1], r[4], r[10]])).toEqual([
      ["Flat 1, Plover Court", "Testford", "'\tTabbed", null],
      ['\'=HYPERLINK("http://bad.example","Flat 2"), -2+3', "'+Testford", "'@SUM(A1:A9)", `0${landlord.org.id}00002`],
      ["Flat 10, Plover Court", "Testford", null, `0${landlord.org.id}00010`],
    ]);
  });

  it("shows another landlord only its own homes, refuses tenants and bad filters", async () => {
    const theirs = await csvRows(otherAdmin, url("csv"));
    expect(theirs.slice(1).map((r) => r[0])).toEqual(["Flat 3, Plover Court"]);
    await tenant.get(url("csv")).expect(403);
    const bad = await officer.get("/api/properties/export?format=pdf").expect(400);
    expect(bad.body.error.message).toMatch(/format must be csv or xlsx/);
  });
});

describe("exporting the officers' queue", () => {
  it("holds the filtered cases with the reference and the shown columns, as on screen", async () => {
    const query = "status=open&sort=reference&order=asc";
    const screen = (await officer.get(`/api/cases?${query}&pageSize=200`).expect(200)).body;
    const rows = await csvRows(officer, `/api/cases/export?${query}&columns=status,estate,vulnerable,mouldIndex`);
    // The screen's order of columns, whatever the order asked in.
    expect(rows[0]).toEqual(["Reference", "Status", "Estate and block", "Mould index", "Vulnerable household"]);
    expect(rows.slice(1).map((r) => r[0])).toEqual(screen.items.map((i: { reference: string }) => i.reference));
    expect(rows.slice(1).find((r) => r[0] === screen.items[0].reference)?.[4]).toMatch(/^(Yes|No)$/);
    expect(rows.length - 1).toBe(screen.total);
    expect(screen.total).toBeGreaterThan(0);
  });

  it("uses the default columns when none are given, and names unknown ones", async () => {
    const rows = await sheetRows(officer, "/api/cases/export?format=xlsx");
    expect(rows[0]).toEqual(["Reference", "Priority", "Home", "Risk state", "Next deadline", "Status"]);
    // The priority is a number cell, not text.
    expect(typeof rows[1]?.[1]).toBe("number");
    const bad = await officer.get("/api/cases/export?columns=priority,secret").expect(400);
    expect(bad.body.error.message).toMatch(/secret is not one of/);
  });

  it("is for staff of the landlord only", async () => {
    await tenant.get("/api/cases/export").expect(403);
    const theirs = await csvRows(otherAdmin, "/api/cases/export");
    expect(theirs.slice(1).map((r) => r[0])).not.toContain(
      (await officer.get(`/api/cases/${caseId}`).expect(200)).body.reference,
    );
  });
});

describe("exporting a case's readings", () => {
  beforeAll(async () => {
    await officer
      .post(`/api/cases/${caseId}/readings`, [
        {
          roomId: bedroomId,
          takenAt: msAgo(2 * DAY).toISOString(),
          airTemperatureC: 17.5,
          relativeHumidityPct: 81,
          outdoorTemperatureC: -3.5,
        },
        {
          roomId: bedroomId,
          takenAt: msAgo(DAY).toISOString(),
          airTemperatureC: 18,
          relativeHumidityPct: 75.5,
          surfaceTemperatureC: 11.2,
        },
      ])
      .expect(201);
  });

  it("keeps negative temperatures as numbers: a number cell in .xlsx, plain digits in CSV", async () => {
    const sheet = await sheetRows(officer, `/api/cases/${caseId}/readings/export?format=xlsx`);
    expect(sheet[0]).toEqual([
      "Taken at (UTC)",
      "Room",
      "Air temperature (°C)",
      "Relative humidity (%)",
      "Surface temperature (°C)",
      "Outdoor temperature (°C)",
      "Source",
    ]);
    expect(sheet.slice(1).map((r) => r.slice(1))).toEqual([
      ["Bedroom", 17.5, 81, null, -3.5, "By hand"],
      ["Bedroom", 18, 75.5, 11.2, null, "By hand"],
    ]);
    const csv = await csvRows(officer, `/api/cases/${caseId}/readings/export?roomId=${bedroomId}`);
    expect(csv.slice(1).map((r) => r[5])).toEqual(["-3.5", ""]);
  });

  it("is for the landlord's staff: tenants and other landlords get nothing", async () => {
    await tenant.get(`/api/cases/${caseId}/readings/export`).expect(403);
    await otherAdmin.get(`/api/cases/${caseId}/readings/export`).expect(404);
  });
});

describe("exporting work orders and accounts", () => {
  it("exports the work orders as filtered", async () => {
    // Work is ordered once the case has been investigated.
    await officer
      .patch(`/api/cases/${caseId}`, { status: "triaged", hazardClass: "significant", reason: "Mould over the bed." })
      .expect(200);
    await officer
      .post(`/api/cases/${caseId}/inspections`, {
        inspectedAt: msAgo(3_600_000).toISOString(),
        cause: "condensation",
        mouldExtent: "under-1-m2",
        findings: "Condensation mould on the bedroom ceiling.",
        roomReadings: [],
      })
      .expect(201);
    await officer
      .post(`/api/cases/${caseId}/work-orders`, { type: "extractor-fan", description: "=cmd|' /C calc'!A0 fan" })
      .expect(201);
    const rows = await csvRows(officer, `/api/work-orders/export?caseId=${caseId}&format=csv`);
    expect(rows[0]).toEqual([
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
    expect(rows.slice(1).map((r) => r[2])).toEqual(["Extractor fan"]);
    const theirs = await csvRows(otherAdmin, `/api/work-orders/export?caseId=${caseId}`);
    expect(theirs).toHaveLength(1);
  });

  it("exports accounts for admins, with a name that looks like a formula neutralised", async () => {
    const ds = t.ctx.dataSource;
    await makeUser(ds, landlord.org, "officer", { name: "@Evil Formula" });
    const rows = await csvRows(admin, "/api/users/export?role=officer");
    expect(rows[0]).toEqual(["Name", "E-mail", "Role", "Status", "Last sign-in"]);
    expect(
      rows
        .slice(1)
        .map((r) => r[0])
        .sort(),
    ).toEqual(["'@Evil Formula", "Test officer"]);
    await officer.get("/api/users/export").expect(403);
  });
});

describe("a large export", () => {
  const HOMES = 30_000;
  let server: http.Server;
  let cookie: string;
  let bulkOrg: Awaited<ReturnType<typeof makeOrganisation>>;

  beforeAll(async () => {
    const ds = t.ctx.dataSource;
    bulkOrg = await makeOrganisation(ds);
    const bulkAdmin = await makeUser(ds, bulkOrg, "admin");
    // Long addresses (about 700 bytes a row, ~20 MB in all): far more than the socket buffers hold,
    // so the server cannot have written the whole file while the client is not reading.
    // Written as a bulk write (the stock import's way): the homes' search pieces are left to the
    // background catch-up instead of a trigger per home, which would outlast the hook's time limit.
    const runner = ds.createQueryRunner();
    await runner.connect();
    try {
      await t.ctx.services.homeSearch.bulkWrite(
        (sql, params) => runner.query(sql, params),
        bulkOrg.id,
        async () => {
          await runner.query(
            `INSERT INTO properties (organisation_id, address_line1, address_line2, town, postcode, estate, built_form, wall_type, glazing_type, heating_type)
             SELECT ?, CONCAT(seq, ' ', REPEAT('Long Street ', 14)), REPEAT('Second line of the address ', 6), REPEAT('Townly ', 14),
                    'ZX1 1AA', 'Bulk Estate', 'mid-terrace', 'solid-brick', 'single', 'gas-boiler'
             FROM seq_1_to_${HOMES}`,
            [bulkOrg.id],
          );
          const [range] = (await runner.query(
            "SELECT MIN(id) AS first, MAX(id) AS last FROM properties WHERE organisation_id = ?",
            [bulkOrg.id],
          )) as { first: number; last: number }[];
          return { result: undefined, wrote: async () => [{ first: Number(range!.first), last: Number(range!.last) }] };
        },
      );
    } finally {
      await runner.release();
    }
    server = await new Promise((resolve) => {
      const s = t.app.listen(0, "127.0.0.1", () => resolve(s));
    });
    const csrf = await request(server).get("/api/auth/csrf").expect(200);
    const login = await request(server)
      .post("/api/auth/login")
      .set("Cookie", csrf.headers["set-cookie"] as unknown as string[])
      .set("X-CSRF-Token", csrf.body.csrfToken)
      .send({ email: bulkAdmin.email, password: PASSWORD })
      .expect(200);
    cookie = (login.headers["set-cookie"] as unknown as string[]).map((c) => c.split(";")[0]).join("; ");
  });
  afterAll(async () => {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
  });

  it("starts before the last row is read, and reads the rows as the client takes them", async () => {
    const { port } = server.address() as AddressInfo;
    const res = await new Promise<IncomingMessage>((resolve, reject) =>
      http.get(`http://127.0.0.1:${port}/api/properties/export?format=csv`, { headers: { cookie } }, resolve).on("error", reject),
    );
    expect(res.statusCode).toBe(200);
    const chunks: Buffer[] = [];
    // Take the first bytes, then stop reading.
    await new Promise<void>((resolve) =>
      res.once("data", (c: Buffer) => {
        res.pause();
        chunks.push(c);
        resolve();
      }),
    );
    // A home added now, which sorts last, is still in the file: the server had not read that far.
    await makeProperty(t.ctx.dataSource, bulkOrg, { estate: "Zz Last Estate", addressLine1: "Added while paused" });
    res.on("data", (c: Buffer) => chunks.push(c));
    res.resume();
    await new Promise((resolve) => res.on("end", resolve));
    const rows = parseCsv(Buffer.concat(chunks), { bom: true }) as string[][];
    expect(rows).toHaveLength(1 + HOMES + 1);
    expect(rows.at(-1)?.[0]).toBe("Added while paused");
    expect(rows[1]?.[0]).toMatch(/^1 Long Street/);
  });

  it("writes a well-formed .xlsx of every row", async () => {
    const { port } = server.address() as AddressInfo;
    const res = await request(`http://127.0.0.1:${port}`)
      .get("/api/properties/export?format=xlsx&estate=Bulk%20Estate")
      .set("Cookie", cookie)
      .buffer(true)
      .parse(binary)
      .expect(200);
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(res.body as ArrayBuffer);
    expect(book.worksheets[0]?.actualRowCount).toBe(1 + HOMES);
  });
});
