// Working days and due instants. Sources beside each check: TRADE.md §5 (working days exclude
// weekends and bank holidays in England and Wales), the holiday package's data (date-holidays,
// read directly here, not through our module), the calendar (weekdays, clock changes: the last
// Sundays of March and October), and our own choices (day 0 is the day of the event; the end of
// a day is 23:59:59.999 Europe/London). Every due instant is asserted as an exact UTC instant, so
// a dependence on the process time zone would show.
import Holidays from "date-holidays";
import { describe, expect, it } from "vitest";
import {
  addCalendarDays,
  addWorkingDays,
  bankHolidayDates,
  endOfLocalDay,
  isWorkingDay,
  localDate,
  workingDaysBetween,
} from "../../src/lib/domain/working-days.js";

const at = (iso: string) => new Date(iso);
const iso = (d: Date) => d.toISOString();
const england = new Holidays("GB", "ENG");
const wales = new Holidays("GB", "WLS");

/** The package's bank holidays for a year, straight from its data. */
function packageBankHolidays(h: Holidays, year: number) {
  return h
    .getHolidays(year)
    .filter((x) => x.type === "public")
    .map((x) => ({ date: x.date.slice(0, 10), substitute: x.substitute === true, name: x.name }));
}

describe("bank holidays", () => {
  it("England's and Wales's bank holidays are the same dates, 2000–2050 (the holiday package's data)", () => {
    for (let year = 2000; year <= 2050; year++) {
      expect(packageBankHolidays(wales, year).map((h) => h.date)).toEqual(packageBankHolidays(england, year).map((h) => h.date));
    }
  });

  it("are the package's public holidays, without its observances (the holiday package's data)", () => {
    const observances = england
      .getHolidays(2026)
      .filter((h) => h.type === "observance")
      .map((h) => h.date.slice(0, 10));
    expect(observances.length).toBeGreaterThan(0); // Mother's Day, Easter Sunday, Father's Day
    for (const year of [2022, 2026, 2027]) {
      expect(bankHolidayDates(year)).toEqual(
        packageBankHolidays(england, year)
          .map((h) => h.date)
          .sort(),
      );
    }
    for (const date of observances) expect(bankHolidayDates(2026)).not.toContain(date);
  });

  it("Christmas 2026: Boxing Day on a Saturday, substitute Monday 28 December (the holiday package's data)", () => {
    const dec = packageBankHolidays(england, 2026).filter((h) => h.date.startsWith("2026-12"));
    const substitute = dec.find((h) => h.substitute);
    expect(substitute).toBeDefined();
    expect(isWorkingDay(substitute!.date)).toBe(false);
    for (const h of dec) expect(bankHolidayDates(2026)).toContain(h.date);
    // From the package's data for 2026: 25 (Fri), 26 (Sat), 28 (Mon, substitute).
    expect(dec.map((h) => [h.date, h.substitute])).toEqual([
      ["2026-12-25", false],
      ["2026-12-26", false],
      ["2026-12-28", true],
    ]);
    expect(new Date("2026-12-26T12:00:00Z").getUTCDay()).toBe(6); // the calendar: a Saturday
    expect(isWorkingDay("2026-12-25")).toBe(false);
    expect(isWorkingDay("2026-12-28")).toBe(false);
    expect(isWorkingDay("2026-12-29")).toBe(true); // the calendar: Tuesday, no holiday in the package's data
  });

  it("Christmas 2022 on a Sunday: substitute Tuesday 27 December (the holiday package's data)", () => {
    const dec = packageBankHolidays(england, 2022).filter((h) => h.date.startsWith("2022-12"));
    for (const h of dec.filter((x) => x.substitute)) expect(isWorkingDay(h.date)).toBe(false);
    // From the package's data for 2022: 25 (Sun), 26 (Mon), 27 (Tue, substitute for Christmas Day).
    expect(dec.map((h) => [h.date, h.substitute])).toEqual([
      ["2022-12-25", false],
      ["2022-12-26", false],
      ["2022-12-27", true],
    ]);
    expect(new Date("2022-12-25T12:00:00Z").getUTCDay()).toBe(0); // the calendar: a Sunday
    expect(isWorkingDay("2022-12-26")).toBe(false);
    expect(isWorkingDay("2022-12-27")).toBe(false);
    expect(isWorkingDay("2022-12-28")).toBe(true);
  });

  it("one-off bank holidays count: 2022's Jubilee and State Funeral (the holiday package's data)", () => {
    const oneOff = packageBankHolidays(england, 2022).filter((h) => ["2022-06-03", "2022-09-19"].includes(h.date));
    expect(oneOff).toHaveLength(2); // from the package's data for 2022
    for (const h of oneOff) expect(isWorkingDay(h.date)).toBe(false);
  });

  it("Easter 2027: Good Friday 26 and Easter Monday 29 March (the holiday package's data)", () => {
    const easter = packageBankHolidays(england, 2027).filter((h) => h.date.startsWith("2027-03"));
    for (const h of easter) expect(isWorkingDay(h.date)).toBe(false);
    // From the package's data for 2027.
    expect(easter.map((h) => h.date)).toEqual(["2027-03-26", "2027-03-29"]);
    expect(isWorkingDay("2027-03-25")).toBe(true);
    expect(isWorkingDay("2027-03-30")).toBe(true);
  });
});

describe("isWorkingDay", () => {
  it("weekends are not working days (TRADE.md §5; the calendar for weekdays)", () => {
    expect(isWorkingDay("2026-11-07")).toBe(false); // Saturday
    expect(isWorkingDay("2026-11-08")).toBe(false); // Sunday
    expect(isWorkingDay("2026-11-09")).toBe(true); // Monday
    expect(isWorkingDay("2026-11-13")).toBe(true); // Friday
  });

  it("rejects anything but a real YYYY-MM-DD (our own choice)", () => {
    for (const bad of ["2026-02-30", "2026-2-3", "2026-13-01", "26-02-03", "2026-02-03T00:00:00Z", ""]) {
      expect(() => isWorkingDay(bad)).toThrow(RangeError);
    }
  });
});

describe("end of a day in Europe/London (our own choice: 23:59:59.999 local)", () => {
  it("is 23:59:59.999Z in winter and 22:59:59.999Z in summer (the calendar: GMT, BST)", () => {
    expect(iso(endOfLocalDay("2026-01-15"))).toBe("2026-01-15T23:59:59.999Z");
    expect(iso(endOfLocalDay("2026-07-15"))).toBe("2026-07-15T22:59:59.999Z");
  });

  it("the day the clocks go forward has 23 hours, the day they go back 25 (the calendar)", () => {
    expect(iso(endOfLocalDay("2026-03-29"))).toBe("2026-03-29T22:59:59.999Z");
    expect(endOfLocalDay("2026-03-29").getTime() - endOfLocalDay("2026-03-28").getTime()).toBe(23 * 3_600_000);
    expect(iso(endOfLocalDay("2026-10-25"))).toBe("2026-10-25T23:59:59.999Z");
    expect(endOfLocalDay("2026-10-25").getTime() - endOfLocalDay("2026-10-24").getTime()).toBe(25 * 3_600_000);
  });

  it("the London day, not the UTC day, is day 0 (our own choice)", () => {
    // 23:30 UTC on Thursday 9 July 2026 is 00:30 BST on Friday 10 July.
    expect(localDate(at("2026-07-09T23:30:00Z"))).toBe("2026-07-10");
    expect(iso(addWorkingDays(at("2026-07-09T23:30:00Z"), 1))).toBe("2026-07-13T22:59:59.999Z"); // Monday
    // In winter London is on UTC: 23:30 UTC on Thursday 8 January is still Thursday.
    expect(iso(addWorkingDays(at("2026-01-08T23:30:00Z"), 1))).toBe("2026-01-09T23:59:59.999Z"); // Friday
  });
});

describe("addWorkingDays (TRADE.md §5 working days; day 0 = the day of the event, our own choice)", () => {
  it("across a weekend: Thursday + 2 is Monday (the calendar)", () => {
    expect(iso(addWorkingDays(at("2026-11-05T09:00:00Z"), 2))).toBe("2026-11-09T23:59:59.999Z");
  });

  it("n = 0 is the end of the same day (our own choice)", () => {
    expect(iso(addWorkingDays(at("2026-11-07T09:00:00Z"), 0))).toBe("2026-11-07T23:59:59.999Z");
  });

  it("awareness on a Saturday: day 1 is Monday; Friday, Saturday and Sunday share a deadline (our own choice)", () => {
    // 10 working days (TRADE.md §5) from Saturday 7 November 2026: Mon 9 … Fri 13, Mon 16 … Fri 20.
    expect(iso(addWorkingDays(at("2026-11-07T14:00:00Z"), 10))).toBe("2026-11-20T23:59:59.999Z");
    expect(iso(addWorkingDays(at("2026-11-06T17:00:00Z"), 10))).toBe("2026-11-20T23:59:59.999Z");
    expect(iso(addWorkingDays(at("2026-11-08T23:00:00Z"), 10))).toBe("2026-11-20T23:59:59.999Z");
    expect(iso(addWorkingDays(at("2026-11-09T08:00:00Z"), 10))).toBe("2026-11-23T23:59:59.999Z");
  });

  it("Christmas 2026 and New Year (the holiday package's data)", () => {
    const christmasEve = at("2026-12-24T12:00:00Z");
    // Skips Fri 25, Sat 26, Sun 27, Mon 28 (substitute).
    expect(iso(addWorkingDays(christmasEve, 1))).toBe("2026-12-29T23:59:59.999Z");
    expect(iso(addWorkingDays(christmasEve, 3))).toBe("2026-12-31T23:59:59.999Z");
    // Then Fri 1 January 2027 (New Year's Day), the weekend: Mon 4 is 4, Tue 5 is 5.
    expect(iso(addWorkingDays(christmasEve, 5))).toBe("2027-01-05T23:59:59.999Z");
  });

  it("Christmas 2022 with its substitute Tuesday (the holiday package's data)", () => {
    expect(iso(addWorkingDays(at("2022-12-23T16:00:00Z"), 1))).toBe("2022-12-28T23:59:59.999Z");
  });

  it("the clocks going forward: Friday 27 March 2026, and Easter 2026 (the calendar; the holiday package's data)", () => {
    const friday = at("2026-03-27T10:00:00Z"); // 10:00 GMT; BST from Sunday 29 March
    expect(iso(addWorkingDays(friday, 1))).toBe("2026-03-30T22:59:59.999Z"); // Monday, end of day BST
    // 10 working days: Mon 30, Tue 31, Wed 1, Thu 2, (Good Friday 3, Easter Monday 6), Tue 7 … Fri 10, Mon 13, Tue 14.
    expect(iso(addWorkingDays(friday, 10))).toBe("2026-04-14T22:59:59.999Z");
  });

  it("the clocks going back: Friday 23 October 2026 (the calendar)", () => {
    const friday = at("2026-10-23T15:00:00Z"); // 16:00 BST; GMT from Sunday 25 October
    expect(iso(addWorkingDays(friday, 1))).toBe("2026-10-26T23:59:59.999Z"); // Monday, end of day GMT
    expect(iso(addWorkingDays(friday, 3))).toBe("2026-10-28T23:59:59.999Z");
  });

  it("Easter 2027 with the clocks going forward on Easter Sunday (the holiday package's data; the calendar)", () => {
    // Thursday 25 March 2027 (GMT); Good Friday 26, Easter Monday 29; BST from Sunday 28.
    expect(iso(addWorkingDays(at("2027-03-25T12:00:00Z"), 1))).toBe("2027-03-30T22:59:59.999Z");
  });

  it("rejects a negative or fractional count and an invalid Date (our own choice)", () => {
    expect(() => addWorkingDays(at("2026-01-05T09:00:00Z"), -1)).toThrow(RangeError);
    expect(() => addWorkingDays(at("2026-01-05T09:00:00Z"), 1.5)).toThrow(RangeError);
    expect(() => addWorkingDays(new Date(Number.NaN), 1)).toThrow(RangeError);
  });
});

describe("addCalendarDays (our own choice: end of the London day, for the week-based stage)", () => {
  it("84 days from Friday 27 March 2026 is Friday 19 June, end of day BST (the calendar)", () => {
    expect(iso(addCalendarDays(at("2026-03-27T10:00:00Z"), 84))).toBe("2026-06-19T22:59:59.999Z");
  });
});

describe("workingDaysBetween (our own choice: days after `from` up to and including `to`)", () => {
  it("counts across Easter 2026 (the holiday package's data)", () => {
    expect(workingDaysBetween(at("2026-03-27T10:00:00Z"), at("2026-04-14T08:00:00Z"))).toBe(10);
    expect(workingDaysBetween(at("2026-04-14T08:00:00Z"), at("2026-03-27T10:00:00Z"))).toBe(-10);
    expect(workingDaysBetween(at("2026-04-03T08:00:00Z"), at("2026-04-06T20:00:00Z"))).toBe(0); // Good Friday → Easter Monday
  });

  it("undoes addWorkingDays, and every due instant ends a London working day (TRADE.md §5; our own choices)", () => {
    const start = Date.UTC(2026, 0, 1);
    for (let t = start; t < Date.UTC(2028, 0, 1); t += 31 * 3_600_000) {
      for (const n of [1, 3, 5, 10]) {
        const due = addWorkingDays(new Date(t), n);
        expect(workingDaysBetween(new Date(t), due)).toBe(n);
        expect(isWorkingDay(localDate(due))).toBe(true);
        expect(localDate(new Date(due.getTime() + 1))).not.toBe(localDate(due));
      }
    }
  });
});

describe("independent of the process time zone (our own choice)", () => {
  it("gives the same UTC instants whatever TZ the process runs in", () => {
    const compute = () => [
      iso(addWorkingDays(at("2026-03-27T10:00:00Z"), 10)),
      iso(addWorkingDays(at("2026-07-09T23:30:00Z"), 1)),
      iso(addWorkingDays(at("2026-10-23T15:00:00Z"), 1)),
      iso(addCalendarDays(at("2026-10-23T15:00:00Z"), 84)),
      localDate(at("2026-12-31T23:30:00Z")),
    ];
    const expected = [
      "2026-04-14T22:59:59.999Z",
      "2026-07-13T22:59:59.999Z",
      "2026-10-26T23:59:59.999Z",
      "2027-01-15T23:59:59.999Z",
      "2026-12-31",
    ];
    // Each zone also reads a year of holidays not read before, so the package runs under it too.
    // Christmas Eve to the first working day after (the holiday package's data for each year).
    const christmas: [string, string, string][] = [
      ["Pacific/Kiritimati", "2032-12-24T12:00:00Z", "2032-12-29T23:59:59.999Z"], // Sat 25, Sun 26; Mon 27, Tue 28 substitutes
      ["America/Los_Angeles", "2033-12-23T12:00:00Z", "2033-12-28T23:59:59.999Z"], // Sun 25, Mon 26; Tue 27 substitute
      ["UTC", "2037-12-24T12:00:00Z", "2037-12-29T23:59:59.999Z"], // Fri 25, Sat 26; Mon 28 substitute
    ];
    const januaryOffsetMinutes: Record<string, number> = { "Pacific/Kiritimati": -840, "America/Los_Angeles": 480, UTC: 0 };
    const saved = process.env.TZ;
    try {
      for (const [tz, eve, due] of christmas) {
        process.env.TZ = tz;
        // The zone really changed for this process, or the test would prove nothing.
        expect(new Date(Date.UTC(2026, 0, 15)).getTimezoneOffset()).toBe(januaryOffsetMinutes[tz]);
        expect(compute()).toEqual(expected);
        expect(iso(addWorkingDays(at(eve), 1))).toBe(due);
      }
    } finally {
      if (saved === undefined) delete process.env.TZ;
      else process.env.TZ = saved;
    }
  });
});
