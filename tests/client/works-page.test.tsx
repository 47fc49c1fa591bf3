import { fireEvent, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, mockApi, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

// Dates are worked out from today's date in London, so the tests keep working as time goes by.
const DAY = 86_400_000;
const today = new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London" }).format(new Date());
const plus = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY).toISOString().slice(0, 10);
/** `days` after today, moved on to the Monday when that falls at a weekend (visits are not booked then). */
const weekdayAhead = (days: number) => {
  const date = plus(today, days);
  const weekday = new Date(`${date}T00:00:00Z`).getUTCDay();
  return weekday === 6 ? plus(date, 2) : weekday === 0 ? plus(date, 1) : date;
};
const mondayOf = (date: string) => plus(date, -((new Date(`${date}T00:00:00Z`).getUTCDay() + 6) % 7));
const thisMonday = mondayOf(today);
const nextMonday = plus(thisMonday, 7);

const staff = [
  { id: 2, name: "Priya Venn", role: "officer" },
  { id: 3, name: "Dale Whitcombe", role: "maintenance" },
  { id: 4, name: "Sam Okafor", role: "maintenance" },
];
const contractors = [
  { id: 7, name: "Brightvent Ltd", email: "jobs@brightvent.example", phone: "01234 567890", trade: "ventilation" },
];

function makeOrder(id: number, overrides: Record<string, unknown> = {}) {
  return {
    id,
    caseId: 40 + id,
    caseReference: `DW-2026-${String(40 + id).padStart(5, "0")}`,
    status: "unscheduled",
    type: "mould-wash",
    description: "Treat the mould on the bedroom ceiling.",
    priority: "urgent",
    targetDate: plus(today, 10),
    rooms: [{ id: 1, name: "Bedroom 1" }],
    property: {
      id: 100 + id,
      addressLine1: `${id} Heron Walk`,
      town: "Easterby",
      postcode: `ZX5 ${id}AB`,
      estate: "Kestrel Rise",
    },
    assignee: null,
    contractor: null,
    slot: null,
    booking: null,
    accessNotes: null,
    completion: null,
    createdAt: "2026-11-20T09:30:00.000Z",
    ...overrides,
  };
}

const slot = (date: string, window: "am" | "pm" | "all-day") => ({
  date,
  window,
  startsAt: `${date}T08:00:00.000Z`,
  endsAt: `${date}T17:00:00.000Z`,
});
const dale = { id: 3, name: "Dale Whitcombe" };
const sam = { id: 4, name: "Sam Okafor" };
/** The order as PATCH /api/work-orders/:id answers a booking: the slot the request asked for, with its times. */
const bookedAs = <O extends object>(order: O, body: unknown) => {
  const { slot: asked } = body as { slot: { date: string; window: "am" | "pm" | "all-day" } };
  return { ...order, slot: slot(asked.date, asked.window) };
};

/** The week board's bookings for the week starting `monday`. */
function weekOrders(monday: string) {
  return [
    makeOrder(1, {
      status: "confirmed",
      assignee: dale,
      slot: slot(monday, "am"),
      booking: { response: "confirmed", reason: null, respondedAt: "2026-12-01T10:00:00.000Z" },
    }),
    makeOrder(2, {
      status: "scheduled",
      type: "extractor-fan",
      assignee: sam,
      slot: slot(plus(monday, 2), "pm"),
      booking: { response: null, reason: null, respondedAt: null },
    }),
    makeOrder(3, {
      status: "change-requested",
      type: "insulation",
      assignee: dale,
      slot: slot(plus(monday, 3), "all-day"),
      booking: { response: "change-requested", reason: "I work on Thursdays.", respondedAt: "2026-12-01T10:00:00.000Z" },
    }),
    makeOrder(4, {
      status: "scheduled",
      type: "roof-gutter",
      contractor: { id: 7, name: "Brightvent Ltd" },
      slot: slot(plus(monday, 4), "am"),
      booking: { response: null, reason: null, respondedAt: null },
    }),
  ];
}

const tableOrders = [
  makeOrder(11, { type: "extractor-fan", targetDate: plus(today, -3) }),
  makeOrder(12, {
    status: "scheduled",
    assignee: dale,
    slot: slot(plus(today, 5), "am"),
    booking: { response: null, reason: null, respondedAt: null },
  }),
];

type Routes = Record<string, MockReply | ((call: RecordedCall, nth: number) => MockReply)>;

function setup(url: string, routes: Routes = {}) {
  const api = mockApi({
    "GET /api/auth/me": { body: users.maintenance },
    "GET /api/auth/csrf": { body: { csrfToken: "works-token" } },
    "GET /api/staff": { body: { users: staff } },
    "GET /api/contractors": { body: { contractors } },
    "GET /api/work-orders": (call) => {
      const items = call.search.has("from") ? weekOrders(call.search.get("from")!) : tableOrders;
      return {
        body: {
          items,
          total: items.length,
          page: Number(call.search.get("page") ?? 1),
          pageSize: Number(call.search.get("pageSize") ?? 25),
        },
      };
    },
    ...routes,
  });
  return { ...api, ...renderApp(url) };
}

const search = (router: { state: { location: { search: string } } }) => new URLSearchParams(router.state.location.search);
const boardCalls = (calls: RecordedCall[]) => calls.filter((c) => c.search.has("from"));
const tableCalls = (calls: RecordedCall[]) => calls.filter((c) => !c.search.has("from"));

async function board() {
  return screen.findByRole("table", { name: /^Bookings for the week of/ });
}

/** The day cells (Monday to Friday) of one row of the board. */
function dayCells(table: HTMLElement, rowName: string) {
  const row = within(table).getByRole("rowheader", { name: rowName }).closest("tr")!;
  return within(row).getAllByRole("cell");
}

async function ordersTable() {
  const table = await screen.findByRole("table", { name: "Work orders" });
  await waitFor(() => expect(within(table).getByRole("link", { name: "DW-2026-00051" })).toBeInTheDocument());
  return table;
}

describe("Works page", () => {
  beforeEach(() => clearCsrfToken());

  it("places morning, afternoon and all-day bookings in the right operative's cells, with the tenant's answer in words", async () => {
    const { callsTo } = setup(`/works?week=${nextMonday}`);
    expect(await screen.findByRole("heading", { level: 1, name: "Works" })).toBeInTheDocument();
    const table = await board();
    await waitFor(() => expect(within(table).getByRole("link", { name: "DW-2026-00041" })).toBeInTheDocument());

    // The week in the URL is the one asked for, Monday to Friday.
    const sent = boardCalls(callsTo("GET", "/api/work-orders"))[0]!.search;
    expect(sent.get("from")).toBe(nextMonday);
    expect(sent.get("to")).toBe(plus(nextMonday, 6));
    expect(sent.get("status")).toBe("scheduled,change-requested,confirmed,done");

    // Column headers are the working days; row headers the operatives, then the contractors.
    const headers = within(table)
      .getAllByRole("columnheader")
      .map((h) => h.textContent);
    expect(headers).toHaveLength(6);
    expect(headers[1]).toMatch(/^Monday \d+ \w+/);
    expect(headers[5]).toMatch(/^Friday/);
    expect(
      within(table)
        .getAllByRole("rowheader")
        .map((h) => h.textContent),
    ).toEqual(["Dale Whitcombe", "Sam Okafor", "Contractors"]);

    // Dale, Monday morning: order 1, confirmed; his Monday afternoon is free.
    const daleDays = dayCells(table, "Dale Whitcombe");
    const daleMonMorning = within(daleDays[0]!).getByRole("group", { name: "Morning 8–12" });
    expect(within(daleMonMorning).getByRole("link", { name: "DW-2026-00041" })).toHaveAttribute("href", "/cases/41");
    expect(within(daleMonMorning).getByText("Mould wash")).toBeInTheDocument();
    expect(within(daleMonMorning).getByText("1 Heron Walk")).toBeInTheDocument();
    expect(within(daleMonMorning).getByText("Confirmed")).toBeInTheDocument();
    expect(within(within(daleDays[0]!).getByRole("group", { name: "Afternoon 12–5" })).getByText("Free")).toBeInTheDocument();

    // Dale, Thursday: the all-day booking spans the day (no separate halves), the tenant asked for another slot.
    const daleThu = daleDays[3]!;
    const allDay = within(daleThu).getByRole("group", { name: "All day 8–5" });
    expect(within(allDay).getByRole("link", { name: "DW-2026-00043" })).toBeInTheDocument();
    expect(within(allDay).getByText("Asked for another slot")).toBeInTheDocument();
    expect(within(daleThu).queryByRole("group", { name: "Morning 8–12" })).not.toBeInTheDocument();
    // Nothing of Sam's in Dale's row.
    expect(within(daleDays[2]!).queryByRole("link")).not.toBeInTheDocument();

    // Sam, Wednesday afternoon: order 2, awaiting the tenant's reply; his Wednesday morning is free.
    const samWed = dayCells(table, "Sam Okafor")[2]!;
    const samPm = within(samWed).getByRole("group", { name: "Afternoon 12–5" });
    expect(within(samPm).getByRole("link", { name: "DW-2026-00042" })).toBeInTheDocument();
    expect(within(samPm).getByText("Awaiting reply")).toBeInTheDocument();
    expect(within(within(samWed).getByRole("group", { name: "Morning 8–12" })).queryByRole("link")).not.toBeInTheDocument();

    // The contractor's booking is in the Contractors row, with the firm's name.
    const contractorFri = within(dayCells(table, "Contractors")[4]!).getByRole("group", { name: "Morning 8–12" });
    expect(within(contractorFri).getByRole("link", { name: "DW-2026-00044" })).toBeInTheDocument();
    expect(within(contractorFri).getByText("Brightvent Ltd")).toBeInTheDocument();
  });

  it("moves between weeks through the URL, and asks for the week it shows", async () => {
    const { callsTo, router } = setup("/works");
    const table = await board();
    await waitFor(() => expect(within(table).getAllByRole("link").length).toBeGreaterThan(0));
    expect(boardCalls(callsTo("GET", "/api/work-orders"))[0]!.search.get("from")).toBe(thisMonday);
    expect(screen.getByRole("button", { name: "This week" })).toBeDisabled();

    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: /Next week/ }));
    await waitFor(() => expect(search(router).get("week")).toBe(nextMonday));
    await waitFor(() =>
      expect(boardCalls(callsTo("GET", "/api/work-orders")).at(-1)!.search.get("to")).toBe(plus(nextMonday, 6)),
    );
    expect(boardCalls(callsTo("GET", "/api/work-orders")).at(-1)!.search.get("from")).toBe(nextMonday);

    await user.click(screen.getByRole("button", { name: /Previous week/ }));
    await user.click(screen.getByRole("button", { name: /Previous week/ }));
    await waitFor(() => expect(search(router).get("week")).toBe(plus(thisMonday, -7)));
    await waitFor(() =>
      expect(boardCalls(callsTo("GET", "/api/work-orders")).at(-1)!.search.get("from")).toBe(plus(thisMonday, -7)),
    );

    await waitFor(() => expect(screen.getByRole("button", { name: "This week" })).toBeEnabled());
    await user.click(screen.getByRole("button", { name: "This week" }));
    await waitFor(() => expect(search(router).has("week")).toBe(false));
    // This week's bookings are still in the cache: the board shows them again.
    await waitFor(() => expect(screen.getByRole("button", { name: "This week" })).toBeDisabled());
  });

  it("says so when no work is booked in the week", async () => {
    setup(`/works?week=${nextMonday}`, {
      "GET /api/work-orders": (call) => ({
        body: {
          items: call.search.has("from") ? [] : tableOrders,
          total: call.search.has("from") ? 0 : 2,
          page: 1,
          pageSize: 25,
        },
      }),
    });
    expect(await screen.findByText("No work booked this week")).toBeInTheDocument();
    // The empty grid is still there to plan with.
    expect(await board()).toBeInTheDocument();
  });

  it("books an operative from the table with the right PATCH body, then closes and refreshes", async () => {
    const date = weekdayAhead(7);
    const { callsTo } = setup("/works", {
      "PATCH /api/work-orders/11": (call) => ({
        body: bookedAs({ ...tableOrders[0], status: "scheduled", assignee: sam }, call.body),
      }),
    });
    const table = await ordersTable();
    const user = userEvent.setup();
    const listCallsBefore = tableCalls(callsTo("GET", "/api/work-orders")).length;

    await user.click(within(table).getByRole("button", { name: "Schedule… DW-2026-00051" }));
    const dialog = await screen.findByRole("dialog", { name: "Schedule DW-2026-00051" });
    // Fan work carries the Approved Document F rates and the electrical caution.
    const rates = within(dialog).getByRole("complementary", { name: "Extract rates for fan work" });
    const intermittent = within(rates).getByRole("table", { name: "Intermittent extract" });
    expect(within(intermittent).getByRole("row", { name: /Bathroom/ })).toHaveTextContent("15 l/s");
    expect(within(rates).getByText("Approved Document F (England, 2021), Volume 1")).toBeInTheDocument();
    expect(within(dialog).getByText(/qualified electrician/)).toHaveTextContent("Part P");

    // Nothing is sent until the slot is complete.
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    expect(within(dialog).getByText("Choose the operative who will do the work.")).toBeInTheDocument();
    expect(within(dialog).getByText("Choose the day of the visit.")).toBeInTheDocument();
    expect(within(dialog).getByText("Choose the morning, the afternoon or all day.")).toBeInTheDocument();
    const dateInput = within(dialog).getByLabelText("Day of the visit");
    expect(dateInput).toHaveAttribute("min", today);
    fireEvent.change(dateInput, { target: { value: plus(today, -1) } });
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    expect(within(dialog).getByText(/cannot be booked in the past/)).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/work-orders/11")).toHaveLength(0);

    await user.selectOptions(within(dialog).getByRole("combobox", { name: "Operative" }), "Sam Okafor");
    fireEvent.change(dateInput, { target: { value: date } });
    await user.click(within(dialog).getByRole("radio", { name: /^Afternoon/ }));
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));

    await waitFor(() => expect(callsTo("PATCH", "/api/work-orders/11")).toHaveLength(1));
    const patch = callsTo("PATCH", "/api/work-orders/11")[0]!;
    expect(patch.body).toEqual({ assigneeId: 4, slot: { date, window: "pm" } });
    expect(patch.headers.get("X-CSRF-Token")).toBe("works-token");
    await waitFor(() => expect(screen.queryByRole("dialog")).not.toBeInTheDocument());
    expect(screen.getByText("DW-2026-00051 is booked")).toBeInTheDocument();
    await waitFor(() => expect(tableCalls(callsTo("GET", "/api/work-orders")).length).toBeGreaterThan(listCallsBefore));
  });

  it("books a contractor when one is chosen", async () => {
    const date = weekdayAhead(3);
    const { callsTo } = setup("/works", { "PATCH /api/work-orders/11": { body: tableOrders[0] } });
    const table = await ordersTable();
    const user = userEvent.setup();
    await user.click(within(table).getByRole("button", { name: "Schedule… DW-2026-00051" }));
    const dialog = await screen.findByRole("dialog", { name: "Schedule DW-2026-00051" });
    await user.click(within(dialog).getByRole("radio", { name: "A contractor" }));
    await waitFor(() => expect(within(dialog).getByRole("option", { name: "Brightvent Ltd (ventilation)" })).toBeInTheDocument());
    await user.selectOptions(within(dialog).getByRole("combobox", { name: "Contractor" }), "Brightvent Ltd (ventilation)");
    fireEvent.change(within(dialog).getByLabelText("Day of the visit"), { target: { value: date } });
    await user.click(within(dialog).getByRole("radio", { name: /^All day/ }));
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    await waitFor(() =>
      expect(callsTo("PATCH", "/api/work-orders/11")[0]?.body).toEqual({ contractorId: 7, slot: { date, window: "all-day" } }),
    );
  });

  it("shows the server's double-booking message and keeps the dialog open for another slot", async () => {
    const clash = "Dale Whitcombe is already booked on Tuesday 8 December 2026, morning. Choose another slot or operative.";
    const { callsTo } = setup("/works", {
      "PATCH /api/work-orders/12": (call, nth) =>
        nth === 0 ? apiError(409, "double_booked", clash) : { body: bookedAs(tableOrders[1]!, call.body) },
    });
    const table = await ordersTable();
    const user = userEvent.setup();

    // A booked order is rebooked with the same dialog, which shows the current slot.
    await user.click(within(table).getByRole("button", { name: "Reschedule… DW-2026-00052" }));
    const dialog = await screen.findByRole("dialog", { name: "Reschedule DW-2026-00052" });
    expect(within(dialog).getByText("Booked now")).toBeInTheDocument();
    expect(within(dialog).getByRole("radio", { name: "One of our operatives" })).toBeChecked();
    expect(within(dialog).getByRole("combobox", { name: "Operative" })).toHaveValue("3");
    expect(within(dialog).getByRole("radio", { name: /^Morning/ })).toBeChecked();
    // Not fan work: no extract rates here.
    expect(within(dialog).queryByText(/qualified electrician/)).not.toBeInTheDocument();

    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    const alert = await within(dialog).findByRole("alert");
    expect(alert).toHaveTextContent("That slot is already taken");
    expect(alert).toHaveTextContent(clash);
    expect(screen.getByRole("dialog", { name: "Reschedule DW-2026-00052" })).toBeInTheDocument();

    // Another half-day goes through, and the dialog closes.
    await user.click(within(dialog).getByRole("radio", { name: /^Afternoon/ }));
    expect(within(dialog).queryByRole("alert")).not.toBeInTheDocument();
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    await waitFor(() => expect(callsTo("PATCH", "/api/work-orders/12")).toHaveLength(2));
    expect(callsTo("PATCH", "/api/work-orders/12")[1]!.body).toEqual({
      assigneeId: 3,
      slot: { date: plus(today, 5), window: "pm" },
    });
    await waitFor(() => expect(screen.queryByRole("dialog")).not.toBeInTheDocument());
  });

  it(
    "opens on the open orders by target date, and puts every filter, sort and page in the URL and the request",
    { timeout: 30_000 },
    async () => {
      const { callsTo, router } = setup("/works");
      const table = await ordersTable();
      expect(Object.fromEntries(tableCalls(callsTo("GET", "/api/work-orders"))[0]!.search)).toEqual({
        status: "unscheduled,scheduled,change-requested,confirmed",
        sort: "target",
        order: "asc",
        page: "1",
        pageSize: "25",
      });
      expect(within(table).getByRole("columnheader", { name: "Target date" })).toHaveAttribute("aria-sort", "ascending");
      // Past its target date: said in words, not only in colour.
      const lateRow = within(table).getByRole("link", { name: "DW-2026-00051" }).closest("tr")!;
      expect(within(lateRow).getByText("Late")).toBeInTheDocument();

      const user = userEvent.setup();
      await user.selectOptions(screen.getByRole("combobox", { name: "Type of work" }), "Extractor fan");
      await waitFor(() => expect(search(router).get("type")).toBe("extractor-fan"));
      // Each next step waits until the page shows the last one, as a person would.
      await waitFor(() => expect(screen.getByRole("combobox", { name: "Type of work" })).toHaveValue("extractor-fan"));
      await user.selectOptions(screen.getByRole("combobox", { name: "Booked with" }), "Sam Okafor");
      await waitFor(() => expect(search(router).get("assignee")).toBe("4"));
      await waitFor(() => expect(screen.getByRole("combobox", { name: "Booked with" })).toHaveValue("4"));
      await user.click(screen.getByRole("checkbox", { name: "Done" }));
      await waitFor(() => expect(search(router).get("status")).toBe("unscheduled,scheduled,change-requested,confirmed,done"));
      await waitFor(() => expect(screen.getByRole("checkbox", { name: "Done" })).toBeChecked());
      await user.click(within(table).getByRole("button", { name: "Slot" }));
      await waitFor(() => expect(search(router).get("sort")).toBe("slot"));

      await waitFor(
        () =>
          expect(Object.fromEntries(tableCalls(callsTo("GET", "/api/work-orders")).at(-1)!.search)).toEqual({
            status: "unscheduled,scheduled,change-requested,confirmed,done",
            type: "extractor-fan",
            assignee: "4",
            sort: "slot",
            order: "asc",
            page: "1",
            pageSize: "25",
          }),
        // Four navigations, each with its loader and refetch: generous when the machine is busy.
        { timeout: 15_000 },
      );

      await user.click(screen.getByRole("button", { name: "Clear filters" }));
      await waitFor(() => expect(Object.fromEntries(search(router))).toEqual({ sort: "slot" }));
    },
  );

  it("reads the table's view from a shared link", async () => {
    const { callsTo } = setup(
      "/works?status=done,cancelled&type=heating&assignee=me&sort=priority&order=desc&page=2&pageSize=10",
      {
        "GET /api/work-orders": (call) => ({
          body: { items: call.search.has("from") ? [] : tableOrders, total: 12, page: 2, pageSize: 10 },
        }),
      },
    );
    await ordersTable();
    expect(Object.fromEntries(tableCalls(callsTo("GET", "/api/work-orders"))[0]!.search)).toEqual({
      status: "done,cancelled",
      type: "heating",
      assignee: "me",
      sort: "priority",
      order: "desc",
      page: "2",
      pageSize: "10",
    });
    expect(screen.getByRole("combobox", { name: "Type of work" })).toHaveValue("heating");
    expect(screen.getByRole("combobox", { name: "Booked with" })).toHaveValue("me");
    expect(screen.getByRole("checkbox", { name: "Done" })).toBeChecked();
    expect(screen.getByRole("checkbox", { name: "To schedule" })).not.toBeChecked();
    expect(screen.getByText("Page 2 of 2")).toBeInTheDocument();
  });

  it("shows the fan guidance in a fan order's expanded row", async () => {
    setup("/works");
    const table = await ordersTable();
    const user = userEvent.setup();
    const toggle = within(table).getByRole("button", { name: "Details of DW-2026-00051" });
    expect(toggle).toHaveAttribute("aria-expanded", "false");
    await user.click(toggle);
    expect(toggle).toHaveAttribute("aria-expanded", "true");
    const note = within(table).getByRole("complementary", { name: "Extract rates for fan work" });
    expect(within(note).getByRole("row", { name: /with a cooker hood extracting outside/ })).toHaveTextContent("30 l/s");
    expect(note).toHaveTextContent("Approved Document F (England, 2021), Volume 1");
    expect(note).toHaveTextContent("qualified electrician");
    // The other order is not fan work.
    await user.click(within(table).getByRole("button", { name: "Details of DW-2026-00052" }));
    expect(within(table).getAllByRole("complementary")).toHaveLength(1);
  });

  it("lists contractors and checks a new one before adding it", async () => {
    const { callsTo } = setup("/works", {
      "POST /api/contractors": (call) => ({ status: 201, body: { id: 8, phone: null, trade: null, ...(call.body as object) } }),
    });
    const panel = await screen.findByRole("region", { name: "Contractors" });
    expect(await within(panel).findByRole("rowheader", { name: "Brightvent Ltd" })).toBeInTheDocument();
    const user = userEvent.setup();
    await user.type(within(panel).getByRole("textbox", { name: /^E-mail address/ }), "not-an-address");
    await user.click(within(panel).getByRole("button", { name: "Add contractor" }));
    expect(await within(panel).findByText("Enter the contractor's name.")).toBeInTheDocument();
    expect(within(panel).getByText("Enter a valid e-mail address, like name@example.org.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/contractors")).toHaveLength(0);

    await user.type(within(panel).getByRole("textbox", { name: "Name" }), "Ridgeline Roofing");
    await user.clear(within(panel).getByRole("textbox", { name: /^E-mail address/ }));
    await user.type(within(panel).getByRole("textbox", { name: /^E-mail address/ }), "office@ridgeline.example");
    await user.type(within(panel).getByRole("textbox", { name: /^Trade/ }), "roofing");
    await user.click(within(panel).getByRole("button", { name: "Add contractor" }));
    await waitFor(() => expect(callsTo("POST", "/api/contractors")).toHaveLength(1));
    expect(callsTo("POST", "/api/contractors")[0]!.body).toEqual({
      name: "Ridgeline Roofing",
      email: "office@ridgeline.example",
      trade: "roofing",
    });
    expect(await within(panel).findByText(/Ridgeline Roofing was added/)).toBeInTheDocument();
  });
});
