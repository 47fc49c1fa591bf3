// ReadingImportService and ReadingService against the run's real MariaDB: logger CSV files in,
// readings out, one transaction per import.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AppError } from "../../server/lib/errors.js";
import { Case } from "../../server/modules/cases/case.entity.js";
import { Room } from "../../server/modules/properties/room.entity.js";
import { ReadingImport } from "../../server/modules/readings/reading-import.entity.js";
import { type ReadingImportService, BATCH_ROWS, HEAD_BYTES } from "../../server/modules/readings/reading-import.service.js";
import { type ReadingService } from "../../server/modules/readings/reading.service.js";
import { makeLandlord } from "../support/factories.js";
import { createTestApp, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

let t: TestApp;
let imports: ReadingImportService;
let readings: ReadingService;
const dir = mkdtempSync(path.join(tmpdir(), "dewline-import-test-"));
let fileNo = 0;

beforeAll(async () => {
  t = await createTestApp();
  imports = t.ctx.services.imports;
  readings = t.ctx.services.readings;
});
afterAll(async () => {
  await t?.close();
  rmSync(dir, { recursive: true, force: true });
});

/** A fresh case with its home's rooms. */
async function makeCase() {
  const ds = t.ctx.dataSource;
  const { org, home, tenant, officer } = await makeLandlord(ds);
  const c = await ds.getRepository(Case).save(
    ds.getRepository(Case).create({
      organisationId: org.id,
      propertyId: home.id,
      reporterUserId: tenant.id,
      tenantUserId: tenant.id,
      channel: "tenant-online",
      awareAt: testClock.now(),
      description: "Black mould on the bedroom window frame.",
      locations: ["window"],
      observations: ["condensation"],
    }),
  );
  const rooms = await ds.getRepository(Room).find({ where: { propertyId: home.id }, order: { id: "ASC" } });
  return { caseId: c.id, roomId: rooms[0].id, otherRoomId: rooms[1].id, actorId: officer.id };
}

function file(content: string | Buffer, name = "logger.csv"): string {
  const p = path.join(dir, `${++fileNo}-${name}`);
  writeFileSync(p, content);
  return p;
}

async function countRows(caseId: number) {
  const [r] = await t.ctx.dataSource.query("SELECT COUNT(*) AS n FROM readings WHERE case_id = ?", [caseId]);
  const [i] = await t.ctx.dataSource.query("SELECT COUNT(*) AS n FROM reading_imports WHERE case_id = ?", [caseId]);
  return { readings: Number(r.n), imports: Number(i.n) };
}

async function storedTimes(caseId: number): Promise<string[]> {
  return (await readings.list(caseId)).map((r) => r.takenAt.toISOString());
}

/** The AppError a promise rejects with. */
async function failure(p: Promise<unknown>): Promise<AppError> {
  const e = await p.then(
    () => undefined,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(AppError);
  return e as AppError;
}

/** n rows at one-minute intervals from 1 January 2025 00:00 UTC, times with Z. */
function loggerCsv(n: number, bad: Record<number, string> = {}): string {
  const lines = ["Timestamp,Temperature (°C),Humidity (%rh)"];
  const start = Date.UTC(2025, 0, 1);
  for (let i = 0; i < n; i++) {
    const line = lines.length + 1;
    const at = new Date(start + i * 60_000).toISOString().replace(".000", "");
    lines.push(bad[line] ?? `${at},${(18 + (i % 50) / 10).toFixed(1)},${(55 + (i % 30)).toFixed(1)}`);
  }
  return lines.join("\n") + "\n";
}

describe("import", () => {
  it("imports 997 of 1 000 rows and reports the 3 bad ones by line, then counts duplicates on a second import", async () => {
    const c = await makeCase();
    const csv = loggerCsv(1000, {
      11: "2025-01-01T00:09:00Z,abc,60",
      502: "2025-01-01T08:20:00Z,20.1,130",
      901: "31/02/2026 10:00,20.1,60",
    });
    const p = file(csv);
    const first = await imports.import({ ...c, filePath: p, fileName: "bedroom-logger.csv" });
    expect(first).toEqual({
      importId: expect.any(Number),
      imported: 997,
      duplicates: 0,
      rejected: 3,
      rejectedReportUrl: `/api/cases/${c.caseId}/readings/imports/${first.importId}/rejected.csv`,
    });
    expect(await countRows(c.caseId)).toEqual({ readings: 997, imports: 1 });

    const report = await imports.rejectedReport(c.caseId, first.importId);
    expect(report).toBe(
      "row,reason\n" +
        "11,air temperature 'abc' is not a number\n" +
        "502,humidity 130 is over 100 %\n" +
        "901,time '31/02/2026 10:00' is not a date\n",
    );
    const saved = await t.ctx.dataSource.getRepository(ReadingImport).findOneByOrFail({ id: first.importId });
    expect(saved).toMatchObject({
      caseId: c.caseId,
      roomId: c.roomId,
      uploadedById: c.actorId,
      fileName: "bedroom-logger.csv",
      imported: 997,
      duplicates: 0,
      rejected: 3,
    });

    const list = await readings.list(c.caseId, { limit: 3 });
    expect(list.map((r) => [r.takenAt.toISOString(), r.airTemperatureC, r.relativeHumidityPct, r.source, r.importId])).toEqual([
      ["2025-01-01T00:00:00.000Z", 18, 55, "import", first.importId],
      ["2025-01-01T00:01:00.000Z", 18.1, 56, "import", first.importId],
      ["2025-01-01T00:02:00.000Z", 18.2, 57, "import", first.importId],
    ]);

    const again = await imports.import({ ...c, filePath: p, fileName: "bedroom-logger.csv" });
    expect(again).toMatchObject({ imported: 0, duplicates: 997, rejected: 3 });
    expect(await countRows(c.caseId)).toEqual({ readings: 997, imports: 2 });

    // The same file into another room of the case is new readings.
    const otherRoom = await imports.import({ ...c, roomId: c.otherRoomId, filePath: p, fileName: "kitchen.csv" });
    expect(otherRoom).toMatchObject({ imported: 997, duplicates: 0 });
  });

  it("counts a time repeated within the file as a duplicate", async () => {
    const c = await makeCase();
    const p = file("Time,Temp,RH\n2025-01-15 10:00,20,60\n2025-01-15 10:00,21,61\n2025-01-15 10:01,20,60\n");
    expect(await imports.import({ ...c, filePath: p, fileName: "x.csv" })).toEqual({
      importId: expect.any(Number),
      imported: 2,
      duplicates: 1,
      rejected: 0,
    });
  });

  it("converts °F to °C (68 °F is 20 °C)", async () => {
    const c = await makeCase();
    const p = file("Time,Temp °F,RH\n2025-01-15 10:00,68,60\n2025-01-15 10:01,50,61\n2025-01-15 10:02,77 F,62\n");
    const preview = await imports.preview(p);
    expect(preview.mapping.temperatureUnit).toBe("F");
    await imports.import({ ...c, filePath: p, fileName: "f.csv" });
    expect((await readings.list(c.caseId)).map((r) => r.airTemperatureC)).toEqual([20, 10, 25]);
  });

  it("reads day-first and month-first dates", async () => {
    const dayFirst = file("Date/Time,Temperature,Humidity\n12/01/2025 10:00,20,60\n13/01/2025 10:00,20,60\n");
    const monthFirst = file("Date/Time,Temperature,Humidity\n01/12/2025 10:00 AM,20,60\n01/13/2025 10:00 PM,20,60\n");
    expect((await imports.preview(dayFirst)).mapping.dateFormat).toBe("DD/MM/YYYY");
    expect((await imports.preview(monthFirst)).mapping.dateFormat).toBe("MM/DD/YYYY");
    const a = await makeCase();
    await imports.import({ ...a, filePath: dayFirst, fileName: "a.csv" });
    expect(await storedTimes(a.caseId)).toEqual(["2025-01-12T10:00:00.000Z", "2025-01-13T10:00:00.000Z"]);
    const b = await makeCase();
    await imports.import({ ...b, filePath: monthFirst, fileName: "b.csv" });
    expect(await storedTimes(b.caseId)).toEqual(["2025-01-12T10:00:00.000Z", "2025-01-13T22:00:00.000Z"]);

    // Nothing over 12: day-first, and the preview says it could not tell.
    const unsure = file("Time,Temp,RH\n01/02/2025 10:00,20,60\n03/02/2025 10:00,20,60\n");
    const preview = await imports.preview(unsure);
    expect(preview.mapping.dateFormat).toBe("DD/MM/YYYY");
    expect(preview.problems.join(" ")).toMatch(/day-first or month-first/);
    // …and the mapping can say month-first.
    const d = await makeCase();
    await imports.import({ ...d, filePath: unsure, fileName: "d.csv", mapping: { dateFormat: "MM/DD/YYYY" } });
    expect(await storedTimes(d.caseId)).toEqual(["2025-01-02T10:00:00.000Z", "2025-03-02T10:00:00.000Z"]);
  });

  it("reads local times in Europe/London (BST is UTC+1 in July); an offset in the value wins", async () => {
    const c = await makeCase();
    const p = file(
      "Timestamp,Temperature,Humidity\n" +
        "2025-07-01 12:00:00,20,60\n" + // BST: 11:00 UTC
        "2025-07-01T13:00:00Z,20,60\n" + // explicit Z: 13:00 UTC
        "2025-07-01T16:00:00+02:00,20,60\n" + // explicit +02:00: 14:00 UTC
        "2025-01-15 12:00:00,20,60\n", // GMT: 12:00 UTC
    );
    await imports.import({ ...c, filePath: p, fileName: "tz.csv" });
    expect(await storedTimes(c.caseId)).toEqual([
      "2025-01-15T12:00:00.000Z",
      "2025-07-01T11:00:00.000Z",
      "2025-07-01T13:00:00.000Z",
      "2025-07-01T14:00:00.000Z",
    ]);

    const ny = await makeCase();
    await imports.import({ ...ny, filePath: p, fileName: "tz.csv", mapping: { timeZone: "America/New_York" } });
    expect((await storedTimes(ny.caseId))[0]).toBe("2025-01-15T17:00:00.000Z"); // EST is UTC−5
  });

  it("rejects a local time in the spring-forward gap and takes the first of two in the autumn fold", async () => {
    // UK clocks went forward at 01:00 UTC on 30 March 2025 and back at 01:00 UTC on 26 October 2025.
    const c = await makeCase();
    const p = file(
      "Time,Temp,RH\n2025-03-30 00:59,20,60\n2025-03-30 01:30,20,60\n2025-03-30 02:00,20,60\n2025-10-26 01:30,20,60\n",
    );
    const result = await imports.import({ ...c, filePath: p, fileName: "dst.csv" });
    expect(result).toMatchObject({ imported: 3, rejected: 1 });
    expect(await imports.rejectedReport(c.caseId, result.importId)).toContain(
      "3,time '2025-03-30 01:30' does not exist in Europe/London",
    );
    expect(await storedTimes(c.caseId)).toEqual([
      "2025-03-30T00:59:00.000Z",
      "2025-03-30T01:00:00.000Z",
      "2025-10-26T00:30:00.000Z",
    ]);
  });

  it("reads semicolons with decimal commas and DD.MM.YYYY dates", async () => {
    const c = await makeCase();
    const p = file("Date/Time;Temperature °C;RH %;Surface temp\n15.01.2025 10:00;20,5;60,1;14,25\n15.01.2025 10:01;−2,5;61;\n");
    const preview = await imports.preview(p);
    expect(preview).toMatchObject({
      delimiter: ";",
      decimalComma: true,
      hasHeader: true,
      mapping: { dateFormat: "DD.MM.YYYY", timestamp: 0, temperature: 1, humidity: 2, surfaceTemperature: 3 },
    });
    const result = await imports.import({ ...c, filePath: p, fileName: "semi.csv" });
    expect(result).toMatchObject({ imported: 2, rejected: 0 });
    const list = await readings.list(c.caseId);
    expect(list.map((r) => [r.airTemperatureC, r.relativeHumidityPct, r.surfaceTemperatureC])).toEqual([
      [20.5, 60.1, 14.25],
      [-2.5, 61, null],
    ]);
  });

  it("stores surface and outdoor temperatures when the file has them", async () => {
    const c = await makeCase();
    const p = file(
      "Time,Temp,RH,Surface temp,Outdoor temp\n2025-01-15 10:00,20,60,13.5,-3\n2025-01-15 10:01,20,60,,4.25\n2025-01-15 10:02,20,60,12,\n",
    );
    expect(await imports.import({ ...c, filePath: p, fileName: "so.csv" })).toMatchObject({ imported: 3, rejected: 0 });
    expect((await readings.list(c.caseId)).map((r) => [r.surfaceTemperatureC, r.outdoorTemperatureC])).toEqual([
      [13.5, -3],
      [null, 4.25],
      [12, null],
    ]);
    // Out of range: outdoor −30…40 °C.
    const bad = file("Time,Temp,RH,Outdoor temp\n2025-01-15 10:00,20,60,41\n2025-01-15 10:01,20,60,5\n");
    const r = await imports.import({ ...c, roomId: c.otherRoomId, filePath: bad, fileName: "o.csv" });
    expect(await imports.rejectedReport(c.caseId, r.importId)).toBe(
      "row,reason\n2,outdoor temperature 41 °C is outside −30…40 °C\n",
    );
  });

  it("strips a UTF-8 byte-order mark", async () => {
    const c = await makeCase();
    const p = file("\uFEFFTimestamp,Temperature,Humidity\r\n2025-01-15 10:00,20,60\r\n2025-01-15 10:01,20,60\r\n");
    const preview = await imports.preview(p);
    expect(preview.headers).toEqual(["Timestamp", "Temperature", "Humidity"]);
    expect(preview.sampleRows).toEqual([
      ["2025-01-15 10:00", "20", "60"],
      ["2025-01-15 10:01", "20", "60"],
    ]);
    expect(await imports.import({ ...c, filePath: p, fileName: "bom.csv" })).toMatchObject({ imported: 2 });
  });

  it("refuses a file that is not UTF-8 (422), at the start or deep inside, and writes nothing", async () => {
    const c = await makeCase();
    const latin1 = file(Buffer.from("Time,Temperature (\xb0C),RH\n2025-01-15 10:00,20,60\n", "latin1"));
    const e = await failure(imports.preview(latin1));
    expect(e.status).toBe(422);
    expect(e.message).toMatch(/^The file is not UTF-8 text/);
    expect((await failure(imports.import({ ...c, filePath: latin1, fileName: "l.csv" }))).status).toBe(422);

    // A bad byte after the first 64 KB only shows while streaming, after batches were sent.
    const good = loggerCsv(12_000);
    expect(good.length).toBeGreaterThan(HEAD_BYTES);
    const late = file(Buffer.concat([Buffer.from(good), Buffer.from("2025-02-01 00:00,20,\xe9\n", "latin1")]));
    const e2 = await failure(imports.import({ ...c, filePath: late, fileName: "late.csv" }));
    expect(e2.status).toBe(422);
    expect(e2.message).toContain("line 12002");
    expect(await countRows(c.caseId)).toEqual({ readings: 0, imports: 0 });

    const utf16 = file(Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from("Time,Temp,RH\n", "utf16le")]));
    const e3 = await failure(imports.preview(utf16));
    expect(e3.status).toBe(422);
    expect(e3.message).toMatch(/UTF-16.*UTF-8/);
  });

  it("says which columns it could not find (422)", async () => {
    const p = file("Name,Colour\nfoo,bar\nbaz,qux\n");
    const e = await failure(imports.preview(p));
    expect(e.status).toBe(422);
    expect(e.message).toMatch(/time, temperature and humidity columns/);
    expect((e.details as { field: string }[]).map((d) => d.field)).toEqual(["timestamp", "temperature", "humidity"]);

    const onlyTemp = file("Time,Temperature\n2025-01-15 10:00,20\n2025-01-15 10:01,20\n");
    const e2 = await failure(imports.preview(onlyTemp));
    expect(e2.message).toMatch(/find the humidity column/);
    const c = await makeCase();
    expect((await failure(imports.import({ ...c, filePath: onlyTemp, fileName: "t.csv" }))).status).toBe(422);
  });

  it("refuses a file of only bad rows (422) and writes nothing", async () => {
    const c = await makeCase();
    const p = file("Time,Temperature,Humidity\n2025-01-15 10:00,abc,60\n2025-01-15 10:01,20,130\n2025-01-15 10:02,20,\n");
    const e = await failure(imports.import({ ...c, filePath: p, fileName: "bad.csv" }));
    expect(e.status).toBe(422);
    expect(e.message).toMatch(/None of the 3 rows/);
    expect(e.details).toEqual([
      { row: 2, reason: "air temperature 'abc' is not a number" },
      { row: 3, reason: "humidity 130 is over 100 %" },
      { row: 4, reason: "humidity is missing" },
    ]);
    expect(await countRows(c.caseId)).toEqual({ readings: 0, imports: 0 });

    const headerOnly = file("Time,Temperature,Humidity\n");
    expect((await failure(imports.import({ ...c, filePath: headerOnly, fileName: "h.csv" }))).status).toBe(422);
    expect((await failure(imports.preview(file("")))).message).toMatch(/empty/);
  });

  it("leaves no readings and no import behind when it fails after the first batch was stored", async () => {
    const c = await makeCase();
    const p = file(loggerCsv(BATCH_ROWS * 2 + 10));
    const seen: number[] = [];
    const e = await imports
      .import({
        ...c,
        filePath: p,
        fileName: "crash.csv",
        onBatch: (rows) => {
          seen.push(rows);
          throw new Error("simulated crash");
        },
      })
      .catch((err: Error) => err);
    expect((e as Error).message).toBe("simulated crash");
    expect(seen).toEqual([BATCH_ROWS]);
    expect(await countRows(c.caseId)).toEqual({ readings: 0, imports: 0 });

    // The same file then imports whole.
    expect(await imports.import({ ...c, filePath: p, fileName: "crash.csv" })).toMatchObject({ imported: BATCH_ROWS * 2 + 10 });
  });

  it("keeps a path-like file name only as a display name", async () => {
    const c = await makeCase();
    const p = file("Time,Temp,RH\n2025-01-15 10:00,20,60\n");
    const result = await imports.import({ ...c, filePath: p, fileName: "../../etc/passwd.csv" });
    const saved = await t.ctx.dataSource.getRepository(ReadingImport).findOneByOrFail({ id: result.importId });
    expect(saved.fileName).toBe("passwd.csv");
    expect(
      (
        await t.ctx.dataSource.getRepository(ReadingImport).findOneByOrFail({
          id: (await imports.import({ ...c, filePath: p, fileName: "C:\\Users\\x\\Desktop\\log.csv" })).importId,
        })
      ).fileName,
    ).toBe("log.csv");
  });

  it("skips logger notes above the header, keeps file line numbers, and reads a file without a header", async () => {
    const c = await makeCase();
    const p = file("Logger export\nSerial number,AB-12\n\nTime,Temp,RH\n2025-01-15 10:00,20,60\n2025-01-15 10:01,20,160\n");
    const preview = await imports.preview(p);
    expect(preview.problems[0]).toMatch(/first 2 lines look like notes/);
    const result = await imports.import({ ...c, filePath: p, fileName: "notes.csv" });
    expect(result).toMatchObject({ imported: 1, rejected: 1 });
    expect(await imports.rejectedReport(c.caseId, result.importId)).toBe("row,reason\n6,humidity 160 is over 100 %\n");

    const d = await makeCase();
    const bare = file("2025-01-15 10:00,20.5,60\n2025-01-15 10:01,20.5,61\n2025-01-15 10:02,20.5,62\n");
    const bp = await imports.preview(bare);
    expect(bp).toMatchObject({
      hasHeader: false,
      headers: ["Column 1", "Column 2", "Column 3"],
      mapping: { timestamp: 0, temperature: 1, humidity: 2 },
    });
    expect(await imports.import({ ...d, filePath: bare, fileName: "bare.csv" })).toMatchObject({ imported: 3, rejected: 0 });
  });

  it("takes mapping overrides, and refuses bad ones with 400", async () => {
    const c = await makeCase();
    // Unnamed channels: by column order the guess is temperature then humidity; here it is the other way round.
    const p = file("Time,Ch1,Ch2\n2025-01-15 10:00,60,20\n2025-01-15 10:01,61,21\n");
    expect((await imports.preview(p)).mapping).toMatchObject({ temperature: 1, humidity: 2 });
    await imports.import({ ...c, filePath: p, fileName: "o.csv", mapping: { temperature: 2, humidity: 1 } });
    expect((await readings.list(c.caseId)).map((r) => [r.airTemperatureC, r.relativeHumidityPct])).toEqual([
      [20, 60],
      [21, 61],
    ]);
    const bad = [
      { temperature: 9 },
      { temperature: 2 },
      { timestamp: -1 },
      { timeZone: "Mars/Olympus" },
      { dateFormat: "YYYYMMDD" },
      { colour: 1 },
    ];
    for (const mapping of bad) {
      const e = await failure(imports.import({ ...c, filePath: p, fileName: "o.csv", mapping: mapping as never }));
      expect(e.status, JSON.stringify(mapping)).toBe(400);
    }
  });

  it("caps the rejected report and ends it with how many more", async () => {
    const c = await makeCase();
    const lines = ["Time,Temp,RH", "2025-01-15 10:00,20,60"];
    for (let i = 0; i < 10_050; i++) lines.push("2025-01-15 10:01,20,130");
    const result = await imports.import({ ...c, filePath: file(lines.join("\n")), fileName: "many.csv" });
    expect(result).toMatchObject({ imported: 1, rejected: 10_050 });
    const report = (await imports.rejectedReport(c.caseId, result.importId)).trimEnd().split("\n");
    expect(report).toHaveLength(1 + 10_000 + 1);
    expect(report[1]).toBe("3,humidity 130 is over 100 %");
    expect(report.at(-1)).toBe(',"…and 50 more rejected rows, not listed"');
  });

  it("gives the report only for the case it belongs to (404 otherwise)", async () => {
    const c = await makeCase();
    const other = await makeCase();
    const result = await imports.import({ ...c, filePath: file("Time,Temp,RH\n2025-01-15 10:00,20,60\n"), fileName: "r.csv" });
    expect(await imports.rejectedReport(c.caseId, result.importId)).toBe("row,reason\n");
    expect((await failure(imports.rejectedReport(other.caseId, result.importId))).status).toBe(404);
    expect((await failure(imports.rejectedReport(c.caseId, 999_999_999))).status).toBe(404);
  });
});

describe("readings", () => {
  it("adds manual readings in one go, skips duplicates, lists them by time and gives the series", async () => {
    const c = await makeCase();
    const at = (iso: string) => new Date(iso);
    const first = await readings.addManual(
      c.caseId,
      [
        {
          roomId: c.roomId,
          takenAt: at("2025-01-15T10:00:00.400Z"),
          airTemperatureC: 19.456,
          relativeHumidityPct: 70,
          surfaceTemperatureC: 12.5,
        },
        {
          roomId: c.roomId,
          takenAt: at("2025-01-15T09:00:00Z"),
          airTemperatureC: 18,
          relativeHumidityPct: 72,
          outdoorTemperatureC: -2,
        },
        { roomId: c.otherRoomId, takenAt: at("2025-01-15T09:30:00Z"), airTemperatureC: 17, relativeHumidityPct: 80 },
      ],
      { actorId: c.actorId },
    );
    expect(first).toEqual({ imported: 3, duplicates: 0 });
    // The same second in the same room is a duplicate.
    expect(
      await readings.addManual(
        c.caseId,
        [{ roomId: c.roomId, takenAt: at("2025-01-15T10:00:00Z"), airTemperatureC: 25, relativeHumidityPct: 50 }],
        { actorId: c.actorId },
      ),
    ).toEqual({ imported: 0, duplicates: 1 });

    const list = await readings.list(c.caseId);
    expect(
      list.map((r) => [
        r.roomId,
        r.takenAt.toISOString(),
        r.airTemperatureC,
        r.relativeHumidityPct,
        r.surfaceTemperatureC,
        r.outdoorTemperatureC,
        r.source,
        r.importId,
      ]),
    ).toEqual([
      [c.roomId, "2025-01-15T09:00:00.000Z", 18, 72, null, -2, "manual", null],
      [c.otherRoomId, "2025-01-15T09:30:00.000Z", 17, 80, null, null, "manual", null],
      [c.roomId, "2025-01-15T10:00:00.000Z", 19.46, 70, 12.5, null, "manual", null],
    ]);
    expect((await readings.list(c.caseId, { roomId: c.otherRoomId })).length).toBe(1);
    expect((await readings.list(c.caseId, { limit: 2 })).map((r) => r.takenAt.toISOString())).toEqual([
      "2025-01-15T09:00:00.000Z",
      "2025-01-15T09:30:00.000Z",
    ]);
    expect((await readings.list(c.caseId, { limit: 2, newest: true })).map((r) => r.takenAt.toISOString())).toEqual([
      "2025-01-15T09:30:00.000Z",
      "2025-01-15T10:00:00.000Z",
    ]);

    expect(await readings.seriesFor(c.caseId, c.roomId)).toEqual([
      { at: at("2025-01-15T09:00:00Z"), airTemperatureC: 18, relativeHumidityPct: 72, outdoorTemperatureC: -2 },
      { at: at("2025-01-15T10:00:00Z"), airTemperatureC: 19.46, relativeHumidityPct: 70, surfaceTemperatureC: 12.5 },
    ]);
    expect((await readings.seriesFor(c.caseId)).length).toBe(3);
  });

  it("refuses readings outside the physical ranges, writing none of them", async () => {
    const c = await makeCase();
    const e = await failure(
      readings.addManual(
        c.caseId,
        [
          { roomId: c.roomId, takenAt: new Date("2025-01-15T09:00:00Z"), airTemperatureC: 18, relativeHumidityPct: 72 },
          { roomId: c.roomId, takenAt: new Date("2025-01-15T10:00:00Z"), airTemperatureC: 60, relativeHumidityPct: 0 },
        ],
        { actorId: c.actorId },
      ),
    );
    expect(e.status).toBe(400);
    expect((e.details as { field: string }[]).map((d) => d.field)).toEqual(["1.airTemperatureC", "1.relativeHumidityPct"]);
    expect(await countRows(c.caseId)).toEqual({ readings: 0, imports: 0 });
  });
});
