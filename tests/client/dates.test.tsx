// Dates are shown in London time whatever the machine's zone (src/lib/dates.ts). The instants are
// fixed, and the expected London wall-clock times were worked out by hand from the UK rule (from
// memory: BST = UTC+1 from the last Sunday of March to the last Sunday of October, GMT = UTC
// otherwise). Run with `TZ=America/New_York` (or any zone) and the results must not change.
import { screen, waitFor, within } from "@testing-library/react";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import {
  formatCalendarLong,
  formatDate,
  formatDateIn,
  formatDateTime,
  formatDateTimeZoned,
  formatDayTimeZoned,
  formatLongDateTime,
  formatWeekdayDateTimeZoned,
  londonLocalInput,
  londonLocalToIso,
  todayInLondon,
} from "@/lib/dates";
import { mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

/** 23:59 on 30 June 2026 in London (BST) is 22:59 UTC. */
const SUMMER = "2026-06-30T22:59:00.000Z";
/** 23:59 on 13 January 2026 in London (GMT) is 23:59 UTC. */
const WINTER = "2026-01-13T23:59:00.000Z";

describe("London dates", () => {
  it("shows a summer deadline at 23:59 BST and a winter one at 23:59 GMT, in every format that names the zone", () => {
    expect(formatDayTimeZoned(SUMMER)).toBe("30 Jun, 23:59 BST");
    expect(formatDayTimeZoned(WINTER)).toBe("13 Jan, 23:59 GMT");
    expect(formatDateTimeZoned(SUMMER)).toBe("30 Jun 2026, 23:59 BST");
    expect(formatWeekdayDateTimeZoned(WINTER)).toBe("Tue, 13 Jan 2026, 23:59 GMT");
    expect(formatLongDateTime(SUMMER)).toBe("Tuesday, 30 June 2026 at 23:59 BST");
  });

  it("keeps the London day and time of an instant, and never shifts a calendar date", () => {
    expect(formatDateTime(SUMMER)).toBe("30 Jun 2026, 23:59");
    // 23:30 UTC on 31 Dec is still 31 Dec in London (GMT); 23:30 UTC on 31 July is 1 August (BST).
    expect(formatDate("2026-12-31T23:30:00.000Z")).toBe("31 December 2026");
    expect(formatDate("2026-07-31T23:30:00.000Z")).toBe("1 August 2026");
    expect(formatDate("2026-03-03")).toBe("3 March 2026");
    expect(formatCalendarLong("2026-12-08")).toBe("Tuesday 8 December 2026");
    expect(todayInLondon(new Date("2026-07-31T23:30:00.000Z"))).toBe("2026-08-01");
  });

  it("reads and writes datetime-local values as London time", () => {
    expect(londonLocalInput(new Date(SUMMER))).toBe("2026-06-30T23:59");
    expect(londonLocalToIso("2026-06-30T23:59")).toBe(SUMMER);
    expect(londonLocalToIso("2026-01-13T23:59")).toBe(WINTER);
    // 01:30 on 29 March 2026 does not happen in London: the clocks go from 01:00 GMT to 02:00 BST.
    expect(londonLocalToIso("2026-03-29T01:30")).toBeNull();
  });

  it("writes the same London days in the tenant's language, each time alike", () => {
    // Welsh month names from memory (Mawrth = March, Awst = August); the pseudo-locales read English dates.
    for (let i = 0; i < 2; i += 1) {
      expect(formatDateIn("cy", "2026-03-03")).toBe("3 Mawrth 2026");
      expect(formatDateIn("cy", "2026-07-31T23:30:00.000Z")).toBe("1 Awst 2026");
      expect(formatDateIn("en-GB", "2026-07-31T23:30:00.000Z")).toBe("1 August 2026");
      expect(formatDateIn("en-XA", "2026-03-03")).toBe("3 March 2026");
      expect(formatDateIn("en-GB", "2026-12-08", "longDay")).toBe("Tuesday 8 December 2026");
    }
    expect(formatDateIn("cy", "not a date")).toBe("not a date");
    expect(formatDateIn("cy", null)).toBe("");
  });
});

describe("the queue's deadlines", () => {
  beforeEach(() => clearCsrfToken());

  it("shows each case's next deadline in London time with its zone, as the workspace does", async () => {
    const item = (id: number, dueAt: string) => ({
      id,
      reference: `DW-2026-${String(id).padStart(5, "0")}`,
      status: "triaged",
      channel: "tenant-online",
      awareAt: "2026-01-02T09:30:00.000Z",
      createdAt: "2026-01-02T09:30:00.000Z",
      property: {
        id: 100 + id,
        addressLine1: `${id} Heron Walk`,
        town: "Easterby",
        postcode: `ZX5 ${id}AB`,
        estate: "Kestrel Rise",
        block: null,
      },
      rooms: [{ id: 1, name: "Bedroom 1" }],
      riskState: "mould-risk",
      mouldIndex: 1.4,
      area: "a4",
      vulnerableHousehold: false,
      hazardClass: null,
      hhsrs: null,
      priority: 50,
      nextDeadline: { stage: "investigate", dueAt },
      overdue: false,
      assignee: null,
    });
    mockApi({
      "GET /api/auth/me": { body: users.officer },
      "GET /api/auth/csrf": { body: { csrfToken: "dates-token" } },
      "GET /api/staff": { body: { users: [] } },
      "GET /api/properties/estates": { body: { estates: ["Kestrel Rise"] } },
      "GET /api/cases": { body: { items: [item(1, SUMMER), item(2, WINTER)], total: 2, page: 1, pageSize: 25 } },
    });
    renderApp("/queue");
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(within(table).getAllByRole("row")).toHaveLength(3));
    const [summer, winter] = within(table).getAllByRole("row").slice(1);
    expect(within(summer!).getByText(/30 Jun, 23:59 BST/)).toBeInTheDocument();
    expect(within(winter!).getByText(/13 Jan, 23:59 GMT/)).toBeInTheDocument();
  });
});
