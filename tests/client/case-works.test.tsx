import { fireEvent, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { todayInLondon } from "@/lib/dates";
import { apiError, mockApi, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { workspaceCase } from "./support/case-fixtures";
import type { RoomResponse } from "@/lib/contracts";
import type { CaseStatus } from "@/lib/schemas/case-report";
import { renderApp } from "./support/render-app";

const homeRooms: RoomResponse[] = [
  { id: 1, name: "Living room", kind: "living" },
  { id: 2, name: "Bedroom 1", kind: "bedroom" },
  { id: 3, name: "Bathroom", kind: "bathroom" },
];

const caseOf = (status: CaseStatus) => workspaceCase({ status, homeRooms });

const staff = [
  { id: 2, name: "Priya Venn", role: "officer" },
  { id: 3, name: "Dale Whitcombe", role: "maintenance" },
  { id: 8, name: "Nell Okoro", role: "maintenance" },
];

const baseOrder = {
  caseId: 42,
  caseReference: "DW-2026-00042",
  priority: "urgent",
  targetDate: "2026-12-11",
  property: { id: 5, addressLine1: "1 Tanner Row", town: "Easterby", postcode: "ZX3 1AA", estate: "Millbeck Terraces" },
  contractor: null,
  completion: null,
  createdAt: "2026-11-30T09:00:00.000Z",
};

/** Booked for Tuesday 8 December 2026 in the morning; the tenant asked for another time. */
const fanOrder = {
  ...baseOrder,
  id: 7,
  status: "change-requested",
  type: "extractor-fan",
  description: "Replace the broken bathroom fan with a humidistat model.",
  rooms: [{ id: 3, name: "Bathroom" }],
  assignee: { id: 3, name: "Dale Whitcombe" },
  slot: { date: "2026-12-08", window: "am", startsAt: "2026-12-08T08:00:00.000Z", endsAt: "2026-12-08T12:00:00.000Z" },
  booking: {
    response: "change-requested",
    reason: "Mornings are school runs; any afternoon works.",
    respondedAt: "2026-12-01T18:00:00.000Z",
  },
  bookings: [
    {
      id: 1,
      date: "2026-12-03",
      window: "pm",
      assignee: { id: 8, name: "Nell Okoro" },
      contractor: null,
      state: "replaced",
      response: null,
      reason: null,
      createdAt: "2026-11-30T10:00:00.000Z",
    },
    {
      id: 2,
      date: "2026-12-08",
      window: "am",
      assignee: { id: 3, name: "Dale Whitcombe" },
      contractor: null,
      state: "active",
      response: "change-requested",
      reason: "Mornings are school runs; any afternoon works.",
      createdAt: "2026-12-01T09:00:00.000Z",
    },
  ],
  accessNotes: "Children under 15 live here. Ring twice; the bell is quiet.",
};

const washOrder = {
  ...baseOrder,
  id: 8,
  status: "done",
  type: "mould-wash",
  priority: "routine",
  description: "Treat the mould in the bedroom corner.",
  rooms: [{ id: 2, name: "Bedroom 1" }],
  assignee: { id: 8, name: "Nell Okoro" },
  slot: { date: "2026-12-02", window: "all-day", startsAt: "2026-12-02T08:00:00.000Z", endsAt: "2026-12-02T17:00:00.000Z" },
  booking: { response: "confirmed", reason: null, respondedAt: "2026-11-30T12:00:00.000Z" },
  bookings: [],
  accessNotes: null,
  completion: {
    at: "2026-12-02T15:30:00.000Z",
    doneOn: "2026-12-02",
    earlyReason: null,
    by: "Nell Okoro",
    note: "Washed and treated 2 m² of mould behind the wardrobe.",
    materials: "Fungicidal wash",
    minutesOnSite: 150,
    followOn: null,
  },
};

const photoOf = (id: number, workOrderId: number | null) => ({
  id,
  url: `/api/photos/${id}`,
  thumbnailUrl: `/api/photos/${id}/thumbnail`,
  width: 1600,
  height: 1200,
  sha256: String(id).repeat(64).slice(0, 64),
  createdAt: "2026-12-02T15:40:00.000Z",
  workOrderId,
});

const emptySummary = {
  count: 0,
  from: null,
  to: null,
  coveredHours: 0,
  meanSurfaceRhPct: null,
  maxSurfaceRhPct: null,
  hoursSurfaceRhAtLeast80: 0,
  hoursAtLeast80PerDay: null,
  mouldIndexFinal: null,
  mouldIndexMax: null,
};

const noWorks = {
  state: "no-works",
  worksDoneAt: null,
  monitoringEndsAt: null,
  monitoringDays: 21,
  rooms: [],
  enoughReadings: false,
  outcome: null,
};

type Routes = Record<string, MockReply | ((call: RecordedCall, nth: number) => MockReply)>;

function staffApi(user: (typeof users)[keyof typeof users], status: CaseStatus, overrides: Routes = {}) {
  return mockApi({
    "GET /api/auth/me": { body: user },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/cases/42": { body: caseOf(status) },
    "GET /api/cases/42/events": { body: { events: [] } },
    "GET /api/cases/42/photos": { body: { photos: [] } },
    "GET /api/cases/42/readings": { body: { readings: [] } },
    "GET /api/cases/42/evaluation": { body: { statement: "Every report is looked into.", rooms: [] } },
    "GET /api/cases/42/triage": { body: { score: 30, computedAt: "2026-12-01T09:00:00.000Z", parts: [] } },
    "GET /api/cases/42/deadlines": {
      body: {
        deadlines: [
          { stage: "make-safe", dueAt: null, doneAt: null, state: "not-applicable", missedReason: null },
          {
            stage: "investigate",
            dueAt: "2026-11-20T23:59:59.999Z",
            doneAt: "2026-11-18T10:00:00.000Z",
            state: "met",
            missedReason: null,
          },
          {
            stage: "summary",
            dueAt: "2026-11-23T23:59:59.999Z",
            doneAt: "2026-11-19T10:00:00.000Z",
            state: "met",
            missedReason: null,
          },
          { stage: "safety-work", dueAt: "2099-12-11T23:59:59.999Z", doneAt: null, state: "pending", missedReason: null },
          { stage: "supplementary-work", dueAt: null, doneAt: null, state: "pending", missedReason: null },
        ],
      },
    },
    "GET /api/cases/42/inspections": { body: { inspections: [] } },
    "GET /api/cases/42/assessments": { body: { assessments: [] } },
    "GET /api/cases/42/related": { body: { cases: [] } },
    "GET /api/cases/42/work-orders": { body: { workOrders: [] } },
    "GET /api/cases/42/verification": { body: noWorks },
    "GET /api/staff": { body: { users: staff } },
    "GET /api/contractors": { body: { contractors: [] } },
    "GET /api/policy": {
      body: {
        emergencyMakeSafeHours: 24,
        investigateWorkingDays: 10,
        summaryWorkingDays: 3,
        safetyWorkWorkingDays: 5,
        supplementaryWorkWeeks: 12,
        monitoringDays: 21,
        source: "default",
      },
    },
    ...overrides,
  });
}

/** The workspace on its Works tab (the work orders and "Did the fix work?"). */
async function openWorkspace() {
  const view = renderApp("/cases/42?tab=works");
  expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
  return view;
}

const region = (name: string) => screen.getByRole("region", { name });
const orderItem = async (name: string) =>
  (await within(region("Works")).findByRole("heading", { level: 4, name })).closest("li")!;

describe("the works of a case, for staff", () => {
  beforeEach(() => clearCsrfToken());

  it("lists each order with its slot in words, the tenant's answer, the notes for the operative, history, completion and after-photos", async () => {
    staffApi(users.maintenance, "works-planned", {
      "GET /api/cases/42/work-orders": { body: { workOrders: [washOrder, fanOrder] } },
      "GET /api/cases/42/photos": { body: { photos: [photoOf(31, null), photoOf(32, 8)] } },
    });
    await openWorkspace();

    const fan = await orderItem("Extractor fan: fit or repair");
    expect(within(fan).getByText("Tenant asked for another time")).toBeInTheDocument();
    expect(within(fan).getByText("Tuesday 8 December 2026, morning 8am–12")).toBeInTheDocument();
    expect(within(fan).getByText("Bathroom")).toBeInTheDocument();
    expect(within(fan).getByText("Urgent")).toBeInTheDocument();
    expect(within(fan).getByText("Dale Whitcombe")).toBeInTheDocument();
    expect(within(fan).getByText(/^Asked for another time on/)).toBeInTheDocument();
    expect(within(fan).getByText("Their reason: “Mornings are school runs; any afternoon works.”")).toBeInTheDocument();
    expect(within(fan).getByText("Children under 15 live here. Ring twice; the bell is quiet.")).toBeInTheDocument();
    // The replaced booking is in the history, not the current one.
    expect(within(fan).getByText("Earlier bookings (1)")).toBeInTheDocument();
    expect(
      within(fan).getByText(/Thursday 3 December 2026, afternoon 12–5pm, Nell Okoro · Replaced by a later booking/),
    ).toBeInTheDocument();
    expect(within(fan).getByRole("button", { name: /^Reschedule…/ })).toBeInTheDocument();

    // The open order needing a new time comes first.
    const headings = within(region("Works"))
      .getAllByRole("heading", { level: 4 })
      .map((h) => h.textContent);
    expect(headings).toEqual(["Extractor fan: fit or repair", "Mould wash and treatment"]);

    const wash = await orderItem("Mould wash and treatment");
    expect(within(wash).getByText("Washed and treated 2 m² of mould behind the wardrobe.")).toBeInTheDocument();
    expect(within(wash).getByText("2 hours 30 minutes")).toBeInTheDocument();
    expect(within(wash).getByText("Fungicidal wash")).toBeInTheDocument();
    // Only the work order's own photo, as a thumbnail that opens full size.
    const after = within(wash).getByRole("region", { name: "Photos after the works" });
    const thumbs = within(after).getAllByRole("button", { name: /^Open photo/ });
    expect(thumbs).toHaveLength(1);
    expect(within(thumbs[0]!).getByRole("presentation", { hidden: true })).toHaveAttribute("src", "/api/photos/32/thumbnail");
    // A done order has nothing left to book.
    expect(within(wash).queryByRole("button", { name: /Schedule|Reschedule/ })).not.toBeInTheDocument();
  });

  it("sends a new work order with the right body, showing the fan guidance for an extractor fan", async () => {
    const user = userEvent.setup();
    const created = {
      ...fanOrder,
      id: 9,
      status: "unscheduled",
      slot: null,
      booking: null,
      bookings: [],
      assignee: null,
      targetDate: "2099-12-11",
    };
    const api = staffApi(users.officer, "investigated", {
      "POST /api/cases/42/work-orders": { status: 201, body: created },
    });
    await openWorkspace();
    const works = region("Works");
    await user.click(within(works).getByRole("button", { name: "New work order" }));

    // Nothing is sent without a type and a description.
    await user.click(within(works).getByRole("button", { name: "Add work order" }));
    expect(within(works).getByText("Choose the type of work.")).toBeInTheDocument();
    expect(within(works).getByText(/Describe the work in a few words/)).toBeInTheDocument();
    expect(api.callsTo("POST", "/api/cases/42/work-orders")).toHaveLength(0);

    const type = within(works).getByLabelText("Type of work");
    expect(within(type).getAllByRole("option").slice(1)).toHaveLength(14);
    expect(within(works).queryByRole("complementary", { name: "Extract rates for fan work" })).not.toBeInTheDocument();
    await user.selectOptions(type, "extractor-fan");
    const guidance = within(works).getByRole("complementary", { name: "Extract rates for fan work" });
    // Approved Document F (England, 2021), Vol. 1, as TRADE.md §6 quotes it.
    expect(within(guidance).getByText("Approved Document F (England, 2021), Volume 1")).toBeInTheDocument();
    const intermittent = within(guidance).getByRole("table", { name: "Intermittent extract" });
    expect(within(within(intermittent).getByRole("row", { name: /Bathroom/ })).getByText("15 l/s")).toBeInTheDocument();
    expect(within(within(intermittent).getByRole("row", { name: /WC/ })).getByText("6 l/s")).toBeInTheDocument();
    expect(within(intermittent).getByRole("row", { name: /without such a cooker hood/ })).toHaveTextContent("60 l/s");
    expect(within(guidance).getByText(/qualified electrician/)).toHaveTextContent("Part P");
    expect(within(works).getByText(/safety-work deadline \(Friday 11 December 2099\)/)).toBeInTheDocument();

    await user.type(within(works).getByLabelText("Description"), "  Fit a humidistat fan in the bathroom.  ");
    await user.click(within(works).getByRole("checkbox", { name: "Bathroom" }));
    await user.click(within(works).getByRole("radio", { name: /^Urgent/ }));
    await user.click(within(works).getByRole("button", { name: "Add work order" }));

    await waitFor(() => expect(api.callsTo("POST", "/api/cases/42/work-orders")).toHaveLength(1));
    expect(api.callsTo("POST", "/api/cases/42/work-orders")[0]!.body).toEqual({
      type: "extractor-fan",
      description: "Fit a humidistat fan in the bathroom.",
      roomIds: [3],
      priority: "urgent",
    });
    expect(
      await within(works).findByText(/Work order added: Extractor fan: fit or repair, to be done by Friday 11 December 2099/),
    ).toBeInTheDocument();
    // The list, the /works page's lists and the case are fetched again.
    await waitFor(() => expect(api.callsTo("GET", "/api/cases/42/work-orders").length).toBeGreaterThan(1));
    expect(api.callsTo("GET", "/api/cases/42").length).toBeGreaterThan(1);
  });

  it("shows the server's refusal of a new order (case not investigated yet)", async () => {
    const user = userEvent.setup();
    staffApi(users.officer, "triaged", {
      "POST /api/cases/42/work-orders": apiError(409, "conflict", "Work can be ordered once the case has been investigated."),
    });
    await openWorkspace();
    const works = region("Works");
    await user.click(within(works).getByRole("button", { name: "New work order" }));
    await user.selectOptions(within(works).getByLabelText("Type of work"), "mould-wash");
    await user.type(within(works).getByLabelText("Description"), "Treat the bedroom mould.");
    await user.click(within(works).getByRole("button", { name: "Add work order" }));
    expect(await within(works).findByText("Work can be ordered once the case has been investigated.")).toBeInTheDocument();
  });

  it("keeps the schedule dialog open with the server's message when the operative is double-booked", async () => {
    const user = userEvent.setup();
    const unbooked = { ...fanOrder, status: "unscheduled", slot: null, booking: null, bookings: [], assignee: null };
    const message = "Dale Whitcombe is already booked on Tuesday 8 December 2099, morning. Choose another slot or operative.";
    const api = staffApi(users.maintenance, "investigated", {
      "GET /api/cases/42/work-orders": { body: { workOrders: [unbooked] } },
      "PATCH /api/work-orders/7": (call, nth) =>
        nth === 0
          ? apiError(409, "double_booked", message)
          : {
              body: {
                ...unbooked,
                status: "scheduled",
                assignee: { id: 3, name: "Dale Whitcombe" },
                slot: {
                  date: "2099-12-08",
                  window: "pm",
                  startsAt: "2099-12-08T12:00:00.000Z",
                  endsAt: "2099-12-08T17:00:00.000Z",
                },
              },
            },
    });
    await openWorkspace();
    // A look at the readings first, so they are on the page (their tab kept, hidden) while booking.
    await user.click(screen.getByRole("tab", { name: "Readings" }));
    await screen.findByRole("tabpanel", { name: "Readings" });
    await waitFor(() => expect(api.callsTo("GET", "/api/cases/42/readings").length).toBeGreaterThan(0));
    await user.click(screen.getByRole("tab", { name: "Works" }));
    await screen.findByRole("tabpanel", { name: "Works" });
    const fan = await orderItem("Extractor fan: fit or repair");
    await user.click(within(fan).getByRole("button", { name: /^Schedule…/ }));
    const dialog = await screen.findByRole("dialog", { name: "Schedule DW-2026-00042" });

    // Only maintenance staff are operatives.
    const operative = within(dialog).getByLabelText("Operative");
    expect(
      within(operative)
        .getAllByRole("option")
        .map((o) => o.textContent),
    ).toEqual(["Choose an operative", "Dale Whitcombe", "Nell Okoro"]);

    // A day in the past is refused before anything is sent.
    await user.selectOptions(operative, "3");
    fireEvent.change(within(dialog).getByLabelText("Day of the visit"), { target: { value: "2020-01-06" } });
    await user.click(within(dialog).getByRole("radio", { name: /^Morning/ }));
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    expect(within(dialog).getByText(/cannot be booked in the past/)).toBeInTheDocument();
    expect(api.callsTo("PATCH", "/api/work-orders/7")).toHaveLength(0);

    fireEvent.change(within(dialog).getByLabelText("Day of the visit"), { target: { value: "2099-12-08" } });
    await user.click(within(dialog).getByRole("radio", { name: /^Morning/ }));
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    const alert = await within(dialog).findByRole("alert");
    expect(alert).toHaveTextContent("That slot is already taken");
    expect(alert).toHaveTextContent(message);
    expect(api.callsTo("PATCH", "/api/work-orders/7")[0]!.body).toEqual({
      assigneeId: 3,
      slot: { date: "2099-12-08", window: "am" },
    });
    expect(screen.getByRole("dialog", { name: "Schedule DW-2026-00042" })).toBeInTheDocument();

    // Another half-day goes through: the dialog closes, the case and its works are fetched again, not its readings.
    const caseCalls = api.callsTo("GET", "/api/cases/42").length;
    const orderCalls = api.callsTo("GET", "/api/cases/42/work-orders").length;
    const readingCalls = api.callsTo("GET", "/api/cases/42/readings").length;
    await user.click(within(dialog).getByRole("radio", { name: /^Afternoon/ }));
    await user.click(within(dialog).getByRole("button", { name: "Book the visit" }));
    await waitFor(() => expect(screen.queryByRole("dialog")).not.toBeInTheDocument());
    expect(api.callsTo("PATCH", "/api/work-orders/7")[1]!.body).toEqual({
      assigneeId: 3,
      slot: { date: "2099-12-08", window: "pm" },
    });
    expect(
      await within(fan).findByText(
        "Booked Dale Whitcombe for Tuesday 8 December 2099, afternoon 12–5pm. The tenant has been asked to confirm.",
      ),
    ).toBeInTheDocument();
    expect(api.callsTo("GET", "/api/cases/42").length).toBeGreaterThan(caseCalls);
    expect(api.callsTo("GET", "/api/cases/42/work-orders").length).toBeGreaterThan(orderCalls);
    expect(readingCalls).toBeGreaterThan(0);
    expect(api.callsTo("GET", "/api/cases/42/readings")).toHaveLength(readingCalls);
  });

  it("requires a note of what was done before recording completion", async () => {
    const user = userEvent.setup();
    // Booked far ahead: recorded today, the work is early and needs a reason.
    const booked = {
      ...fanOrder,
      status: "confirmed",
      slot: { date: "2099-12-08", window: "am", startsAt: "2099-12-08T08:00:00.000Z", endsAt: "2099-12-08T12:00:00.000Z" },
      booking: { response: "confirmed", reason: null, respondedAt: "2026-12-01T18:00:00.000Z" },
    };
    const api = staffApi(users.maintenance, "works-planned", {
      "GET /api/cases/42/work-orders": { body: { workOrders: [booked] } },
      "PATCH /api/work-orders/7": { body: { ...booked, status: "done" } },
    });
    await openWorkspace();
    const fan = await orderItem("Extractor fan: fit or repair");
    await user.click(within(fan).getByRole("button", { name: /^Record completion…/ }));
    const dialog = await screen.findByRole("dialog", { name: "Record completion: Extractor fan: fit or repair" });

    await user.click(within(dialog).getByRole("button", { name: "Record completion" }));
    expect(within(dialog).getByText(/Say what was done/)).toBeInTheDocument();
    expect(within(dialog).getByText("Enter the day the work was done.")).toBeInTheDocument();
    expect(within(dialog).getByLabelText("Day the work was done")).toHaveFocus();
    // A day still to come is refused; today, before the booked day, asks why.
    fireEvent.change(within(dialog).getByLabelText("Day the work was done"), { target: { value: "2099-12-09" } });
    await user.click(within(dialog).getByRole("button", { name: "Record completion" }));
    expect(within(dialog).getByText(/cannot be recorded as done on a day still to come/)).toBeInTheDocument();
    fireEvent.change(within(dialog).getByLabelText("Day the work was done"), { target: { value: todayInLondon() } });
    await user.click(within(dialog).getByRole("button", { name: "Record completion" }));
    expect(within(dialog).getByText(/done before the booked day: say why/)).toBeInTheDocument();
    expect(within(dialog).getByLabelText("Why was it done before the booked day?")).toHaveFocus();
    await user.type(
      within(dialog).getByLabelText("Why was it done before the booked day?"),
      "The tenant asked for an earlier visit.",
    );
    await user.click(within(dialog).getByRole("button", { name: "Record completion" }));
    expect(within(dialog).getByLabelText("What was done")).toHaveFocus();
    await user.type(within(dialog).getByLabelText("What was done"), "Done");
    await user.click(within(dialog).getByRole("button", { name: "Record completion" }));
    expect(within(dialog).getByText(/at least 5 characters/)).toBeInTheDocument();
    await user.type(within(dialog).getByLabelText(/^Time on site/), "ninety");
    await user.click(within(dialog).getByRole("button", { name: "Record completion" }));
    expect(within(dialog).getByText(/whole number of minutes/)).toBeInTheDocument();
    expect(api.callsTo("PATCH", "/api/work-orders/7")).toHaveLength(0);

    await user.type(within(dialog).getByLabelText("What was done"), ": fitted a 15 l/s humidistat fan.");
    await user.clear(within(dialog).getByLabelText(/^Time on site/));
    await user.type(within(dialog).getByLabelText(/^Time on site/), "90");
    await user.click(within(dialog).getByRole("button", { name: "Record completion" }));
    await waitFor(() => expect(api.callsTo("PATCH", "/api/work-orders/7")).toHaveLength(1));
    expect(api.callsTo("PATCH", "/api/work-orders/7")[0]!.body).toEqual({
      complete: {
        note: "Done: fitted a 15 l/s humidistat fan.",
        minutesOnSite: 90,
        doneOn: todayInLondon(),
        earlyReason: "The tenant asked for an earlier visit.",
      },
    });
    expect(await within(fan).findByText(/Completion recorded/)).toBeInTheDocument();
  });

  it("asks for a reason and a confirmation before cancelling an order", async () => {
    const user = userEvent.setup();
    const unbooked = { ...fanOrder, status: "unscheduled", slot: null, booking: null, bookings: [], assignee: null };
    const api = staffApi(users.admin, "investigated", {
      "GET /api/cases/42/work-orders": { body: { workOrders: [unbooked] } },
      "PATCH /api/work-orders/7": { body: { ...unbooked, status: "cancelled" } },
    });
    await openWorkspace();
    const fan = await orderItem("Extractor fan: fit or repair");
    await user.click(within(fan).getByRole("button", { name: /^Cancel order/ }));
    const dialog = await screen.findByRole("dialog", { name: /^Cancel this work order\?/ });
    await user.click(within(dialog).getByRole("button", { name: "Cancel the order" }));
    expect(within(dialog).getByText("Say why the work order is being cancelled.")).toBeInTheDocument();
    expect(api.callsTo("PATCH", "/api/work-orders/7")).toHaveLength(0);
    await user.type(within(dialog).getByLabelText("Reason for cancelling"), "Fan was replaced under warranty.");
    await user.click(within(dialog).getByRole("button", { name: "Cancel the order" }));
    await waitFor(() => expect(api.callsTo("PATCH", "/api/work-orders/7")).toHaveLength(1));
    expect(api.callsTo("PATCH", "/api/work-orders/7")[0]!.body).toEqual({
      cancel: { reason: "Fan was replaced under warranty." },
    });
  });

  it("compares the readings before and after the works, room by room, and records the outcome after a confirmation", async () => {
    const user = userEvent.setup();
    const verification = {
      state: "monitoring",
      worksDoneAt: "2026-12-02T15:30:00.000Z",
      monitoringEndsAt: "2026-12-23T15:30:00.000Z",
      monitoringDays: 21,
      enoughReadings: true,
      outcome: null,
      rooms: [
        {
          roomId: 2,
          roomName: "Bedroom 1",
          comparison: {
            worksDoneAt: "2026-12-02T15:30:00.000Z",
            before: {
              count: 336,
              from: "2026-11-18T00:00:00.000Z",
              to: "2026-12-01T23:00:00.000Z",
              coveredHours: 335,
              meanSurfaceRhPct: 86.4,
              maxSurfaceRhPct: 97.2,
              hoursSurfaceRhAtLeast80: 250.5,
              hoursAtLeast80PerDay: 17.95,
              mouldIndexFinal: 1.84,
              mouldIndexMax: 1.84,
            },
            after: {
              count: 120,
              from: "2026-12-02T16:00:00.000Z",
              to: "2026-12-07T15:00:00.000Z",
              coveredHours: 119,
              meanSurfaceRhPct: 71.2,
              maxSurfaceRhPct: 82.6,
              hoursSurfaceRhAtLeast80: 6,
              hoursAtLeast80PerDay: 1.21,
              mouldIndexFinal: 0.03,
              mouldIndexMax: 0.03,
            },
            improved: true,
            points: [
              { at: "2026-12-01T23:00:00.000Z", surfaceRhPct: 88, phase: "before" },
              { at: "2026-12-02T16:00:00.000Z", surfaceRhPct: 72, phase: "after" },
            ],
          },
        },
        {
          roomId: 3,
          roomName: "Bathroom",
          comparison: {
            worksDoneAt: "2026-12-02T15:30:00.000Z",
            before: {
              ...emptySummary,
              count: 10,
              meanSurfaceRhPct: 90,
              maxSurfaceRhPct: 95,
              hoursSurfaceRhAtLeast80: 9,
              hoursAtLeast80PerDay: 21.6,
              from: "2026-12-01T10:00:00.000Z",
              to: "2026-12-01T19:00:00.000Z",
              coveredHours: 9,
              mouldIndexFinal: 0.4,
              mouldIndexMax: 0.4,
            },
            after: emptySummary,
            improved: null,
            points: [],
          },
        },
      ],
    };
    const api = staffApi(users.maintenance, "monitoring", {
      "GET /api/cases/42/verification": { body: verification },
      "POST /api/cases/42/verification": { body: { ...verification, state: "decided" } },
    });
    await openWorkspace();
    const panel = region("Did the fix work?");
    expect(await within(panel).findByText("Monitoring until Wednesday 23 December 2026 (21 days)")).toBeInTheDocument();

    const bedroom = within(panel).getByRole("region", { name: "Bedroom 1" });
    expect(within(bedroom).getByText("Improved")).toBeInTheDocument();
    const table = within(bedroom).getByRole("table");
    const row = (name: string) => within(table).getByRole("row", { name: new RegExp(`^${name}`) });
    expect(
      within(row("Mean surface humidity"))
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["86 %", "71 %"]);
    expect(
      within(row("Highest surface humidity"))
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["97 %", "83 %"]);
    expect(
      within(row("Hours at or above 80 %"))
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["250.5 h", "6.0 h"]);
    expect(
      within(row("… per day"))
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["18.0 h", "1.2 h"]);
    expect(
      within(row("Mould index at the end"))
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["1.84", "0.03"]);
    expect(
      within(row("Number of readings"))
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["336", "120"]);
    expect(
      within(row("Period"))
        .getAllByRole("cell")
        .map((c) => c.textContent),
    ).toEqual(["18 Nov 2026 to 1 Dec 2026", "2 Dec 2026 to 7 Dec 2026"]);
    // The chart has a text alternative.
    expect(
      within(bedroom).getByText(
        /^Surface humidity in Bedroom 1 over time, with the works on 2 Dec 2026 marked\. Before the works: 336 readings, mean 86 %/,
      ),
    ).toBeInTheDocument();

    const bathroom = within(panel).getByRole("region", { name: "Bathroom" });
    expect(within(bathroom).getByText("Not enough readings yet")).toBeInTheDocument();

    // Not effective: a note and the next work, then a confirmation.
    await user.click(within(panel).getByRole("button", { name: "Not effective" }));
    await user.click(within(panel).getByRole("button", { name: "Record: not effective…" }));
    expect(within(panel).getByText("Say what the readings and the visit showed.")).toBeInTheDocument();
    expect(within(panel).getByText("Choose the work to try next.")).toBeInTheDocument();
    await user.click(within(panel).getByRole("button", { name: "Fix effective" }));
    await user.type(
      within(panel).getByLabelText("What the readings and the visit showed"),
      "Surface humidity down from 86 % to 71 %; no new mould.",
    );
    await user.click(within(panel).getByRole("button", { name: "Record: fix effective…" }));
    const confirm = await screen.findByRole("dialog", { name: "Close the case as fixed?" });
    expect(api.callsTo("POST", "/api/cases/42/verification")).toHaveLength(0);
    await user.click(within(confirm).getByRole("button", { name: "Yes, the fix worked" }));
    await waitFor(() => expect(api.callsTo("POST", "/api/cases/42/verification")).toHaveLength(1));
    expect(api.callsTo("POST", "/api/cases/42/verification")[0]!.body).toEqual({
      effective: true,
      note: "Surface humidity down from 86 % to 71 %; no new mould.",
    });
  });

  it("asks for a reason before recording fix effective without the readings after the works", async () => {
    const user = userEvent.setup();
    const monitoring = {
      ...noWorks,
      state: "monitoring",
      worksDoneAt: "2026-12-02T15:30:00.000Z",
      monitoringEndsAt: "2026-12-23T15:30:00.000Z",
    };
    const api = staffApi(users.maintenance, "monitoring", {
      "GET /api/cases/42/verification": { body: monitoring },
      "POST /api/cases/42/verification": { body: { ...monitoring, state: "decided" } },
    });
    await openWorkspace();
    const panel = region("Did the fix work?");
    await user.click(await within(panel).findByRole("button", { name: "Fix effective" }));
    expect(within(panel).getByText("Not enough readings after the works yet")).toBeInTheDocument();
    await user.type(within(panel).getByLabelText("What the readings and the visit showed"), "No mould seen on the visit.");
    await user.click(within(panel).getByRole("button", { name: "Record: fix effective…" }));
    expect(within(panel).getByText(/Say why the fix can be judged without the readings/)).toBeInTheDocument();
    expect(within(panel).getByLabelText("Why decide without the readings")).toHaveFocus();
    expect(api.callsTo("POST", "/api/cases/42/verification")).toHaveLength(0);
    await user.type(
      within(panel).getByLabelText("Why decide without the readings"),
      "The tenant has no hygrometer; visit showed dry walls.",
    );
    await user.click(within(panel).getByRole("button", { name: "Record: fix effective…" }));
    await user.click(
      within(await screen.findByRole("dialog", { name: "Close the case as fixed?" })).getByRole("button", {
        name: "Yes, the fix worked",
      }),
    );
    await waitFor(() => expect(api.callsTo("POST", "/api/cases/42/verification")).toHaveLength(1));
    expect(api.callsTo("POST", "/api/cases/42/verification")[0]!.body).toEqual({
      effective: true,
      note: "No mould seen on the visit.",
      override: { reason: "The tenant has no hygrometer; visit showed dry walls." },
    });
  });

  it("shows the recorded outcome, and offers no decision to an officer", async () => {
    staffApi(users.officer, "closed", {
      "GET /api/cases/42/verification": {
        body: {
          state: "decided",
          worksDoneAt: "2026-12-02T15:30:00.000Z",
          monitoringEndsAt: "2026-12-23T15:30:00.000Z",
          monitoringDays: 21,
          rooms: [],
          enoughReadings: true,
          outcome: {
            effective: true,
            note: "Dry corner, no mould.",
            at: "2026-12-23T16:00:00.000Z",
            by: "Dale Whitcombe",
            override: null,
          },
        },
      },
    });
    await openWorkspace();
    const panel = region("Did the fix work?");
    expect(await within(panel).findByText("Recorded: the fix was effective")).toBeInTheDocument();
    expect(within(panel).getByText("Dry corner, no mould.")).toBeInTheDocument();
    expect(within(panel).queryByRole("button", { name: "Fix effective" })).not.toBeInTheDocument();
  });
});

function tenantApi(status: CaseStatus, workOrders: unknown[], overrides: Routes = {}) {
  return mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/cases/42": { body: caseOf(status) },
    "GET /api/cases/42/events": { body: { events: [] } },
    "GET /api/cases/42/photos": { body: { photos: [] } },
    "GET /api/cases/42/readings": { body: { readings: [] } },
    "GET /api/cases/42/evaluation": {
      body: { statement: "Your landlord will look into this report whatever the readings show.", rooms: [] },
    },
    "GET /api/cases/42/work-orders": { body: { workOrders } },
    "GET /api/cases/42/verification": { body: noWorks },
    ...overrides,
  });
}

/** What the tenant's API gives: no staff-only fields. */
const tenantOrder = (o: typeof fanOrder | typeof washOrder) => {
  // The operative's description, the bookings and the access notes are staff only.
  const { accessNotes: _a, bookings: _b, description: _d, ...rest } = o;
  return rest;
};

describe("the repairs on the tenant's case page", () => {
  beforeEach(() => clearCsrfToken());

  it("shows no repairs section while there are no work orders", async () => {
    tenantApi("investigated", []);
    renderApp("/cases/42");
    expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
    await screen.findByRole("region", { name: "What your readings show" });
    expect(screen.queryByRole("region", { name: "Repairs" })).not.toBeInTheDocument();
  });

  it("lets the tenant confirm the offered appointment, then says what they said", async () => {
    const user = userEvent.setup();
    const offered = {
      ...tenantOrder(fanOrder),
      status: "scheduled",
      booking: { response: null, reason: null, respondedAt: null },
    };
    const confirmed = {
      ...offered,
      status: "confirmed",
      booking: { response: "confirmed", reason: null, respondedAt: "2026-12-01T18:00:00.000Z" },
    };
    const api = tenantApi("works-planned", [offered], {
      "GET /api/cases/42/work-orders": (_call, nth) => ({ body: { workOrders: [nth === 0 ? offered : confirmed] } }),
      "POST /api/work-orders/7/booking-response": { body: confirmed },
    });
    renderApp("/cases/42");
    const repairs = await screen.findByRole("region", { name: "Repairs" });
    expect(within(repairs).getByRole("heading", { name: "Fit or repair an extractor fan" })).toBeInTheDocument();
    // The room's name is data, marked so translation leaves it alone: the line reads the same.
    expect(within(repairs).getByText((_, el) => el?.tagName === "P" && el.textContent === "Where: Bathroom")).toBeInTheDocument();
    expect(
      within(repairs).getByText(/^We would like to come on Tuesday 8 December( 2026)?, in the morning \(8am to 12 noon\)\.$/),
    ).toBeInTheDocument();
    expect(within(repairs).getByText(/will show you their ID/)).toBeInTheDocument();
    expect(within(repairs).getByText(/keep children and pets away from the work area/)).toBeInTheDocument();
    // The staff-only notes never reach the tenant's page.
    expect(screen.queryByText(/Ring twice/)).not.toBeInTheDocument();

    await user.click(within(repairs).getByRole("button", { name: "Confirm this appointment" }));
    await waitFor(() => expect(api.callsTo("POST", "/api/work-orders/7/booking-response")).toHaveLength(1));
    expect(api.callsTo("POST", "/api/work-orders/7/booking-response")[0]!.body).toEqual({ response: "confirm" });
    expect(await within(repairs).findByText("You confirmed this appointment")).toBeInTheDocument();
    expect(within(repairs).getByText("Your landlord has been told.")).toBeInTheDocument();
    expect(within(repairs).queryByRole("button", { name: "Confirm this appointment" })).not.toBeInTheDocument();
  });

  it("lets the tenant ask for another time, with the days and times that suit them", async () => {
    const user = userEvent.setup();
    const offered = {
      ...tenantOrder(fanOrder),
      status: "scheduled",
      booking: { response: null, reason: null, respondedAt: null },
    };
    const answered = {
      ...offered,
      status: "change-requested",
      booking: { response: "change-requested", reason: "Any weekday afternoon.", respondedAt: "2026-12-01T18:00:00.000Z" },
    };
    const api = tenantApi("works-planned", [offered], {
      "GET /api/cases/42/work-orders": (_call, nth) => ({ body: { workOrders: [nth === 0 ? offered : answered] } }),
      "POST /api/work-orders/7/booking-response": { body: answered },
    });
    renderApp("/cases/42");
    const repairs = await screen.findByRole("region", { name: "Repairs" });
    await user.click(within(repairs).getByRole("button", { name: "Ask for another time" }));
    await user.click(within(repairs).getByRole("button", { name: "Send" }));
    expect(within(repairs).getByText("Tell us which days or times suit you better.")).toBeInTheDocument();
    expect(api.callsTo("POST", "/api/work-orders/7/booking-response")).toHaveLength(0);

    await user.type(within(repairs).getByLabelText("Which days and times suit you better?"), "Any weekday afternoon.");
    await user.click(within(repairs).getByRole("button", { name: "Send" }));
    await waitFor(() => expect(api.callsTo("POST", "/api/work-orders/7/booking-response")).toHaveLength(1));
    expect(api.callsTo("POST", "/api/work-orders/7/booking-response")[0]!.body).toEqual({
      response: "another-slot",
      reason: "Any weekday afternoon.",
    });
    expect(await within(repairs).findByText("You asked for another time")).toBeInTheDocument();
    expect(
      within(repairs).getByText((_, el) => el?.tagName === "P" && el.textContent === "You said: “Any weekday afternoon.”"),
    ).toBeInTheDocument();
    expect(within(repairs).getByText(/Your landlord has been told and will offer you a new appointment/)).toBeInTheDocument();
  });

  it("says what was done, and asks for readings while the repair is being checked", async () => {
    tenantApi("monitoring", [tenantOrder(washOrder)], {
      "GET /api/cases/42/verification": {
        body: {
          ...noWorks,
          state: "monitoring",
          worksDoneAt: "2026-12-02T15:30:00.000Z",
          monitoringEndsAt: "2026-12-23T15:30:00.000Z",
        },
      },
    });
    renderApp("/cases/42");
    const repairs = await screen.findByRole("region", { name: "Repairs" });
    expect(within(repairs).getByRole("heading", { name: "Clean and treat the mould" })).toBeInTheDocument();
    expect(within(repairs).getByText("Done on Wednesday 2 December 2026")).toBeInTheDocument();
    expect(within(repairs).getByText("Washed and treated 2 m² of mould behind the wardrobe.")).toBeInTheDocument();
    expect(within(repairs).queryByText(/Fungicidal wash/)).not.toBeInTheDocument();
    expect(
      await within(repairs).findByText("We are checking the repair worked until Wednesday 23 December 2026"),
    ).toBeInTheDocument();
    expect(within(repairs).getByRole("link", { name: "add readings" })).toHaveAttribute("href", "#case-next");
    expect(within(repairs).getByText(/tell us if mould comes back/)).toBeInTheDocument();
  });
});
