// The pure CSV helpers of the readings import: delimiter, numbers, dates, time zones, header
// names, layout and the rejected-rows report. No database.
import { describe, expect, it } from "vitest";
import { detectDateFormat, parseDateTime } from "../../server/modules/readings/csv/dates.js";
import { detectDelimiter } from "../../server/modules/readings/csv/delimiter.js";
import { checkHead, firstInvalidUtf8, Utf8StreamCheck } from "../../server/modules/readings/csv/encoding.js";
import { detectLayout } from "../../server/modules/readings/csv/layout.js";
import { proposeMapping, roleFromHeader, unitFromHeader, type Mapping } from "../../server/modules/readings/csv/mapping.js";
import { fahrenheitToCelsius, parseNumber } from "../../server/modules/readings/csv/numbers.js";
import { RejectedReport } from "../../server/modules/readings/csv/report.js";
import { createRowConverter, emptyRow } from "../../server/modules/readings/csv/rows.js";
import { ZoneConverter } from "../../src/lib/domain/time-zone.js";

const iso = (ms: number) => new Date(ms).toISOString();

describe("delimiter", () => {
  it("finds comma, semicolon (with decimal commas) and tab", () => {
    expect(detectDelimiter("Time,Temp,RH\n2025-01-15 07:00,20.5,60\n2025-01-15 07:01,20.4,61\n")).toBe(",");
    expect(detectDelimiter("Time;Temp;RH\n15.01.2025 07:00;20,5;60,1\n15.01.2025 07:01;20,4;61\n")).toBe(";");
    expect(detectDelimiter("Time\tTemp\tRH\n2025-01-15 07:00\t20,5\t60\n")).toBe("\t");
  });
  it("is not fooled by notes above the header", () => {
    const text = "Logger export\nSerial: 123\nTime,Temp,RH\n" + "2025-01-15 07:00,20.5,60\n".repeat(10);
    expect(detectDelimiter(text)).toBe(",");
  });
});

describe("numbers", () => {
  it("reads plain numbers, decimal commas only when allowed, a real minus sign and units", () => {
    expect(parseNumber("20.5", false)).toEqual({ value: 20.5, unit: null });
    expect(parseNumber("20,5", true)).toEqual({ value: 20.5, unit: null });
    expect(parseNumber("20,5", false)).toBeNull();
    expect(parseNumber("−3.5", false)).toEqual({ value: -3.5, unit: null });
    expect(parseNumber("68 °F", false)).toEqual({ value: 68, unit: "F" });
    expect(parseNumber("20.5C", false)).toEqual({ value: 20.5, unit: "C" });
    expect(parseNumber("55 %RH", false)).toEqual({ value: 55, unit: "%" });
    expect(parseNumber("abc", false)).toBeNull();
    expect(parseNumber("", false)).toBeNull();
  });
  it("converts °F to °C", () => {
    // The Fahrenheit scale's definition: 32 °F = 0 °C, 212 °F = 100 °C, so 68 °F = 20 °C.
    expect(fahrenheitToCelsius(68)).toBeCloseTo(20, 10);
    expect(fahrenheitToCelsius(32)).toBe(0);
    expect(fahrenheitToCelsius(-40)).toBe(-40);
  });
});

describe("dates", () => {
  const wall = (y: number, mo: number, d: number, h: number, mi: number, s = 0) => Date.UTC(y, mo - 1, d, h, mi, s);
  it("reads each supported format", () => {
    expect(parseDateTime("2025-01-15T07:00:00Z", "ISO 8601")).toEqual({ wallMs: wall(2025, 1, 15, 7, 0), offsetMinutes: 0 });
    expect(parseDateTime("2025-01-15 07:00:00", "ISO 8601")).toEqual({ wallMs: wall(2025, 1, 15, 7, 0), offsetMinutes: null });
    expect(parseDateTime("2025-01-15 07:00", "ISO 8601")?.wallMs).toBe(wall(2025, 1, 15, 7, 0));
    expect(parseDateTime("2025-07-01T12:00:00+01:00", "ISO 8601")?.offsetMinutes).toBe(60);
    expect(parseDateTime("2025-07-01T12:00:00.250-0530", "ISO 8601")).toEqual({
      wallMs: wall(2025, 7, 1, 12, 0),
      offsetMinutes: -330,
    });
    expect(parseDateTime("15/01/2025 07:00", "DD/MM/YYYY")?.wallMs).toBe(wall(2025, 1, 15, 7, 0));
    expect(parseDateTime("15-01-25 07:00:30", "DD/MM/YYYY")?.wallMs).toBe(wall(2025, 1, 15, 7, 0, 30));
    expect(parseDateTime("01/15/2025 07:00:00 PM", "MM/DD/YYYY")?.wallMs).toBe(wall(2025, 1, 15, 19, 0));
    expect(parseDateTime("01/15/2025 12:05:00 AM", "MM/DD/YYYY")?.wallMs).toBe(wall(2025, 1, 15, 0, 5));
    expect(parseDateTime("01/15/2025 12:05 pm", "MM/DD/YYYY")?.wallMs).toBe(wall(2025, 1, 15, 12, 5));
    expect(parseDateTime("2025/01/15 07:00:00", "YYYY/MM/DD")?.wallMs).toBe(wall(2025, 1, 15, 7, 0));
    expect(parseDateTime("15.01.2025 07:00", "DD.MM.YYYY")?.wallMs).toBe(wall(2025, 1, 15, 7, 0));
    expect(parseDateTime("1736924400", "epoch seconds")).toEqual({
      wallMs: Date.parse("2025-01-15T07:00:00Z"),
      offsetMinutes: 0,
    });
    expect(parseDateTime("1736924400000", "epoch milliseconds")?.wallMs).toBe(Date.parse("2025-01-15T07:00:00Z"));
  });
  it("refuses dates that do not exist and malformed times", () => {
    expect(parseDateTime("31/02/2026 10:00", "DD/MM/YYYY")).toBeNull();
    expect(parseDateTime("29/02/2025 10:00", "DD/MM/YYYY")).toBeNull();
    expect(parseDateTime("29/02/2024 10:00", "DD/MM/YYYY")).not.toBeNull(); // 2024 is a leap year
    expect(parseDateTime("15/13/2025 10:00", "DD/MM/YYYY")).toBeNull();
    expect(parseDateTime("2025-01-15 24:00", "ISO 8601")).toBeNull();
    expect(parseDateTime("01/15/2025 13:00 PM", "MM/DD/YYYY")).toBeNull();
    expect(parseDateTime("2025-01-15", "ISO 8601")).toBeNull();
    expect(parseDateTime("yesterday", "ISO 8601")).toBeNull();
  });
  it("tells day-first from month-first by a field over 12, and says when it cannot", () => {
    expect(detectDateFormat(["12/01/2025 10:00", "13/01/2025 10:00"])).toMatchObject({
      format: "DD/MM/YYYY",
      ambiguousDayMonth: false,
    });
    expect(detectDateFormat(["01/12/2025 10:00", "01/13/2025 10:00"])).toMatchObject({
      format: "MM/DD/YYYY",
      ambiguousDayMonth: false,
    });
    expect(detectDateFormat(["01/02/2025 10:00", "03/04/2025 10:00"])).toMatchObject({
      format: "DD/MM/YYYY",
      ambiguousDayMonth: true,
    });
    expect(detectDateFormat(["2025-01-15 07:00", "2025-01-15 07:01"])?.format).toBe("ISO 8601");
    expect(detectDateFormat(["1736924400", "1736924460"])?.format).toBe("epoch seconds");
    expect(detectDateFormat(["1", "2", "3"])).toBeNull();
  });
});

describe("time zones", () => {
  // UK clocks change at 01:00 UTC on the last Sunday of March and of October (the Summer Time
  // Order 2002, matching EU directive 2000/84/EC): 30 March and 26 October in 2025.
  const london = new ZoneConverter("Europe/London");
  it("takes an hour off in British Summer Time and nothing in winter", () => {
    expect(iso(london.toUtc(Date.UTC(2025, 6, 1, 12, 0)))).toBe("2025-07-01T11:00:00.000Z");
    expect(iso(london.toUtc(Date.UTC(2025, 0, 15, 12, 0)))).toBe("2025-01-15T12:00:00.000Z");
  });
  it("has no 01:00–01:59 on the spring-forward day", () => {
    expect(london.toUtc(Date.UTC(2025, 2, 30, 1, 30))).toBeNaN();
    expect(iso(london.toUtc(Date.UTC(2025, 2, 30, 0, 59)))).toBe("2025-03-30T00:59:00.000Z");
    expect(iso(london.toUtc(Date.UTC(2025, 2, 30, 2, 0)))).toBe("2025-03-30T01:00:00.000Z");
  });
  it("takes the first of the two 01:30s on the fall-back day", () => {
    expect(iso(london.toUtc(Date.UTC(2025, 9, 26, 1, 30)))).toBe("2025-10-26T00:30:00.000Z");
    expect(iso(london.toUtc(Date.UTC(2025, 9, 26, 2, 0)))).toBe("2025-10-26T02:00:00.000Z");
  });
  it("handles other zones", () => {
    // New York is UTC−5 in January (EST), from the IANA tz database.
    expect(iso(new ZoneConverter("America/New_York").toUtc(Date.UTC(2025, 0, 15, 7, 0)))).toBe("2025-01-15T12:00:00.000Z");
    expect(iso(new ZoneConverter("UTC").toUtc(Date.UTC(2025, 6, 1, 12, 0)))).toBe("2025-07-01T12:00:00.000Z");
    expect(() => new ZoneConverter("Mars/Olympus")).toThrow();
  });
});

describe("encoding", () => {
  it("accepts UTF-8 and a BOM, refuses UTF-16, workbooks and Latin-1", () => {
    expect(checkHead(Buffer.from("Time,°C\n"), true)).toEqual({ ok: true, bomLength: 0 });
    expect(checkHead(Buffer.from("\uFEFFTime,°C\n"), true)).toEqual({ ok: true, bomLength: 3 });
    expect(checkHead(Buffer.from([0xff, 0xfe, 0x54, 0x00]), true)).toMatchObject({
      ok: false,
      message: expect.stringContaining("UTF-16"),
    });
    expect(checkHead(Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x14]), true)).toMatchObject({
      ok: false,
      message: expect.stringContaining("workbook"),
    });
    expect(checkHead(Buffer.from("Time,Temp\n1,2\nTemp \xb0C\n", "latin1"), true)).toMatchObject({
      ok: false,
      message: expect.stringMatching(/not UTF-8 text: line 3/),
    });
  });
  it("allows a character cut by the end of a sample but not of a file", () => {
    const cut = Buffer.from("ab°").subarray(0, 3);
    expect(firstInvalidUtf8(cut, true)).toBe(-1);
    expect(firstInvalidUtf8(cut, false)).toBe(2);
  });
  it("finds a bad byte across chunk boundaries, by line", () => {
    const s = new Utf8StreamCheck();
    const deg = Buffer.from("°");
    expect(s.push(Buffer.concat([Buffer.from("a\nb\n"), deg.subarray(0, 1)]))).toBe(0);
    expect(s.push(Buffer.concat([deg.subarray(1), Buffer.from("\nc\n")]))).toBe(0);
    expect(s.push(Buffer.from("d\n\xe9\n", "latin1"))).toBe(6); // a, b, °, c, d, then the bad byte
  });
});

describe("header names", () => {
  it("recognises common names", () => {
    const cases: [string, string | null][] = [
      ["Timestamp", "timestamp"],
      ["Date/Time", "timestamp"],
      ["Time", "timestamp"],
      ["Date Time (UTC)", "timestamp"],
      ["Temperature (°C)", "temperature"],
      ["Temp °F", "temperature"],
      ["Celsius(°C)", "temperature"],
      ["Humidity (%rh)", "humidity"],
      ["RH", "humidity"],
      ["%RH", "humidity"],
      ["Relative humidity", "humidity"],
      ["Surface temp", "surfaceTemperature"],
      ["Outdoor temp", "outdoorTemperature"],
      ["Dew Point (°C)", "ignore"],
      ["Outdoor RH", "ignore"],
      ["No.", "ignore"],
      ["Comments", null],
    ];
    for (const [header, role] of cases) expect(roleFromHeader(header), header).toBe(role);
  });
  it("reads the unit from the header", () => {
    expect(unitFromHeader("Temp °F")).toBe("F");
    expect(unitFromHeader("Temperature (F)")).toBe("F");
    expect(unitFromHeader("Fahrenheit")).toBe("F");
    expect(unitFromHeader("Celsius(°C)")).toBe("C");
    expect(unitFromHeader("Temperature")).toBeNull();
  });
});

describe("layout and mapping", () => {
  it("skips notes above the header and maps by name", () => {
    const text =
      "Logger export\nSerial number,XY-123\n\nNo.,Time,Temperature (°C),Humidity (%rh),Dew Point (°C)\n" +
      Array.from(
        { length: 20 },
        (_, i) => `${i + 1},2025-01-15 07:${String(i).padStart(2, "0")}:00,20.${i % 10},6${i % 10},12.1`,
      ).join("\n");
    const layout = detectLayout(text, true);
    expect(layout).toMatchObject({ delimiter: ",", hasHeader: true, skipRecords: 4, noteRecords: 2 });
    expect(layout.headers[1]).toBe("Time");
    const p = proposeMapping(layout.headers, layout.dataRows, layout.decimalComma);
    expect(p.missing).toEqual([]);
    expect(p.mapping).toMatchObject({
      timestamp: 1,
      temperature: 2,
      humidity: 3,
      temperatureUnit: "C",
      dateFormat: "ISO 8601",
      timeZone: "Europe/London",
    });
  });
  it("guesses from the values when there is no header, and says so", () => {
    const text = Array.from({ length: 20 }, (_, i) => `2025-01-15 07:${String(i).padStart(2, "0")},19.5,${55 + i}`).join("\n");
    const layout = detectLayout(text, true);
    expect(layout.hasHeader).toBe(false);
    expect(layout.headers).toEqual(["Column 1", "Column 2", "Column 3"]);
    const p = proposeMapping(null, layout.dataRows, false);
    expect(p.mapping).toMatchObject({ timestamp: 0, temperature: 1, humidity: 2 });
    expect(p.problems.join(" ")).toMatch(/no header row/);
  });
  it("joins separate Date and Time columns", () => {
    const text = "Date,Time,Temp,RH\n" + Array.from({ length: 5 }, (_, i) => `15/01/2025,07:0${i},20,60`).join("\n");
    const layout = detectLayout(text, true);
    const p = proposeMapping(layout.headers, layout.dataRows, false);
    expect(p.mapping).toMatchObject({ timestamp: 0, timeOfDay: 1, temperature: 2, humidity: 3, dateFormat: "DD/MM/YYYY" });
  });
  it("says which columns it could not find", () => {
    const p = proposeMapping(["Name", "Colour"], [["a", "b"]], false);
    expect(p.missing.map((m) => m.field)).toEqual(["timestamp", "temperature", "humidity"]);
  });
  it("takes temperatures over 45 without a unit for °F and says so", () => {
    const p = proposeMapping(
      ["Time", "Temperature", "RH"],
      [
        ["2025-01-15 07:00", "68", "50"],
        ["2025-01-15 07:01", "69", "51"],
      ],
      false,
    );
    expect(p.mapping.temperatureUnit).toBe("F");
    expect(p.problems.join(" ")).toMatch(/°F/);
  });
});

describe("rows", () => {
  const mapping: Mapping = {
    timestamp: 0,
    temperature: 1,
    humidity: 2,
    surfaceTemperature: 3,
    temperatureUnit: "C",
    dateFormat: "ISO 8601",
    timeZone: "Europe/London",
  };
  const convert = createRowConverter(mapping, { decimalComma: false, nowMs: Date.parse("2026-01-01T00:00:00Z") });
  const run = (record: string[]) => {
    const row = emptyRow();
    const reason = convert(record, row);
    return {
      reason,
      out:
        reason === null
          ? [row.takenAt, row.airTemperatureC, row.relativeHumidityPct, row.surfaceTemperatureC, row.outdoorTemperatureC]
          : [],
    };
  };
  it("converts a good row", () => {
    expect(run(["2025-07-01 12:00:00", "20.456", "55", ""])).toEqual({
      reason: null,
      out: ["2025-07-01 11:00:00", 20.46, 55, null, null],
    });
    expect(run(["2025-07-01T12:00:00Z", "68 °F", "55", "15"]).out).toEqual(["2025-07-01 12:00:00", 20, 55, 15, null]);
  });
  it("gives every reason a row is rejected", () => {
    expect(run(["2025-01-15 07:00", "abc", "50", ""]).reason).toBe("air temperature 'abc' is not a number");
    expect(run(["2025-01-15 07:00", "20", "130", ""]).reason).toBe("humidity 130 is over 100 %");
    expect(run(["2025-01-15 07:00", "20", "0", ""]).reason).toBe("humidity 0 is not above 0 %");
    expect(run(["2025-01-15 07:00", "-40", "50", ""]).reason).toBe("air temperature −40 °C is outside −20…50 °C");
    expect(run(["2025-01-15 07:00", "20", "50", "-31"]).reason).toBe("surface temperature −31 °C is outside −30…50 °C");
    expect(run(["31/02/2026 10:00", "20", "50", ""]).reason).toBe("time '31/02/2026 10:00' is not a date");
    expect(run(["2025-03-30 01:30", "20", "50", ""]).reason).toMatch(/does not exist in Europe\/London/);
    expect(run(["2027-01-01 00:00", "20", "50", ""]).reason).toMatch(/in the future/);
    expect(run(["", "", "", ""]).reason).toBe("time is missing; air temperature is missing; humidity is missing");
    expect(run(["2025-01-15 07:00", "abc", "130", ""]).reason).toBe(
      "air temperature 'abc' is not a number; humidity 130 is over 100 %",
    );
  });
});

describe("rejected report", () => {
  it("quotes reasons and caps the rows listed", () => {
    const r = new RejectedReport(2);
    r.add(3, "air temperature 'a,b' is not a number");
    r.add(5, "humidity 130 is over 100 %");
    r.add(9, "x");
    r.add(12, "y");
    expect(r.count).toBe(4);
    expect(r.toCsv()).toBe(
      'row,reason\n3,"air temperature \'a,b\' is not a number"\n5,humidity 130 is over 100 %\n,"…and 2 more rejected rows, not listed"\n',
    );
    expect(new RejectedReport().toCsv()).toBeNull();
  });
});
