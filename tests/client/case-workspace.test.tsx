import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { caseKeys } from "@/lib/query-keys";
import { clearCsrfToken } from "@/lib/api-client";
import { evaluateSeries } from "@/lib/domain";
import { CASE_TRANSITIONS } from "@/lib/domain/case-workflow";
import { hhsrsScore } from "@/lib/domain/hhsrs";
import { apiError, mockApi, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { workspaceCase } from "./support/case-fixtures";
import { renderApp } from "./support/render-app";

const theCase = workspaceCase();

const staff = [
  { id: 2, name: "Priya Venn", role: "officer" },
  { id: 3, name: "Dale Whitcombe", role: "maintenance" },
  { id: 7, name: "Sam Okafor", role: "officer" },
];

const officer = { name: "Priya Venn", role: "officer" };
const events = [
  {
    id: 1,
    type: "case-created",
    at: "2026-01-10T08:00:00.000Z",
    actor: { name: "Robin Ashdown", role: "tenant" },
    before: null,
    after: null,
    email: null,
  },
  {
    id: 2,
    type: "email-queued",
    at: "2026-01-10T08:00:01.000Z",
    actor: null,
    before: null,
    after: { outboxId: 9, to: "robin@example.org", template: "caseAcknowledgement" },
    email: {
      status: "sent",
      to: "robin@example.org",
      template: "caseAcknowledgement",
      sentAt: "2026-01-10T08:00:03.000Z",
      error: null,
    },
  },
  {
    id: 5,
    type: "email-resent",
    at: "2026-01-10T12:00:00.000Z",
    actor: officer,
    before: null,
    after: {
      outboxId: 9,
      to: "robin@example.org",
      template: "caseAcknowledgement",
      subject: "We have your report DW-2026-00042",
    },
    email: {
      status: "sent",
      to: "robin@example.org",
      template: "caseAcknowledgement",
      sentAt: "2026-01-10T12:00:02.000Z",
      error: null,
    },
  },
  {
    id: 3,
    type: "internal-note",
    at: "2026-01-11T09:00:00.000Z",
    actor: officer,
    before: null,
    after: { body: "Key safe code is with the caretaker." },
    email: null,
  },
  {
    id: 4,
    type: "message-to-tenant",
    at: "2026-01-11T10:00:00.000Z",
    actor: officer,
    before: null,
    after: { body: "We will visit on Tuesday." },
    email: { status: "failed", to: "robin@example.org", template: "caseMessage", sentAt: null, error: "Mailbox unavailable" },
  },
];

const triage = {
  score: 47,
  computedAt: "2026-01-12T09:00:00.000Z",
  parts: [
    { factor: "surface-state", points: 13, max: 18, explanation: "The worst surface is at mould-growth risk." },
    { factor: "vulnerability", points: 16, max: 20, explanation: "Children under 15 live here." },
    { factor: "hhsrs", points: 4, max: 24, explanation: "Not assessed yet: counted like a Category 2 hazard." },
    { factor: "deadline", points: 14, max: 14, explanation: "The investigation is due soon." },
  ],
};

// Due dates far ahead, so the states stay as they are whenever the test runs.
const deadlinesBefore = [
  { stage: "make-safe", dueAt: null, doneAt: null, state: "not-applicable", missedReason: null },
  { stage: "investigate", dueAt: "2099-01-23T23:59:59.999Z", doneAt: null, state: "pending", missedReason: null },
  { stage: "summary", dueAt: null, doneAt: null, state: "pending", missedReason: null },
  { stage: "safety-work", dueAt: null, doneAt: null, state: "pending", missedReason: null },
  { stage: "supplementary-work", dueAt: null, doneAt: null, state: "pending", missedReason: null },
];

const deadlinesAfter = [
  { stage: "make-safe", dueAt: null, doneAt: null, state: "not-applicable", missedReason: null },
  {
    stage: "investigate",
    dueAt: "2026-01-23T23:59:59.999Z",
    doneAt: "2026-01-14T10:00:00.000Z",
    state: "met",
    missedReason: null,
  },
  { stage: "summary", dueAt: "2099-01-16T23:59:59.999Z", doneAt: null, state: "pending", missedReason: null },
  { stage: "safety-work", dueAt: "2099-01-21T23:59:59.999Z", doneAt: null, state: "pending", missedReason: null },
  { stage: "supplementary-work", dueAt: "2099-04-08T23:59:59.999Z", doneAt: null, state: "pending", missedReason: null },
];

const inspection = {
  id: 5,
  caseId: 42,
  inspectedAt: "2026-01-14T10:00:00.000Z",
  inspectorUserId: 2,
  cause: "condensation",
  mouldExtent: "1-to-5-m2",
  findings: "Mould behind the wardrobe on the external wall; extractor fan in the bathroom not working.",
  roomReadings: [
    {
      roomId: 2,
      airTemperatureC: 17.5,
      relativeHumidityPct: 74,
      surfaceTemperaturesC: [11.2, 12],
      moisture: { value: 18, unit: "wme" },
    },
  ],
  createdAt: "2026-01-14T11:00:00.000Z",
};

const assessmentOf = (id: number, version: number, likelihood: number, spread: [number, number, number, number], at: string) => {
  const r = hhsrsScore({ likelihood, spread });
  return {
    id,
    version,
    likelihood,
    spread,
    justification: `Judgement number ${version} from the visit.`,
    score: r.displayScore,
    band: r.band,
    category: r.category,
    assessorId: 2,
    createdAt: at,
  };
};
const assessments = [
  assessmentOf(1, 1, 320, [0, 1, 10, 89], "2026-01-14T12:00:00.000Z"),
  assessmentOf(2, 2, 100, [0, 4.6, 21.5, 73.9], "2026-01-15T12:00:00.000Z"),
];

const related = {
  cases: [
    {
      id: 17,
      reference: "DW-2025-00017",
      status: "closed",
      awareAt: "2025-03-02T09:00:00.000Z",
      hazardClass: "not-significant",
      description: "Condensation on the windows",
    },
  ],
};

// Two days of hourly readings in the bedroom: humid air against a cold corner.
const readings = Array.from({ length: 48 }, (_, i) => ({
  id: i + 1,
  roomId: 2,
  takenAt: new Date(Date.UTC(2026, 0, 9, 0) + i * 3_600_000).toISOString(),
  airTemperatureC: 18,
  relativeHumidityPct: 72,
  surfaceTemperatureC: 12.5,
  outdoorTemperatureC: 4,
  source: "import",
  importId: 3,
}));
const series = evaluateSeries({
  readings: readings.map((r) => ({
    at: r.takenAt,
    airTemperatureC: r.airTemperatureC,
    relativeHumidityPct: r.relativeHumidityPct,
    surfaceTemperatureC: r.surfaceTemperatureC,
    outdoorTemperatureC: r.outdoorTemperatureC,
  })),
  element: "corner-thermal-bridge",
});
const evaluation = {
  statement: "Every report is looked into whatever the readings show.",
  rooms: [{ roomId: 2, roomName: "Bedroom 1", readingsCount: 48, latest: null, surfaces: [], series }],
};

type Routes = Record<string, MockReply | ((call: RecordedCall, nth: number) => MockReply)>;

// The conversation as the officer sees it: the tenant's unread message, and a message the tenant has read.
const conversation = {
  messages: [
    {
      id: 11,
      kind: "to-tenant",
      at: "2026-01-12T10:05:00.000Z",
      author: { name: "Priya Venn", role: "officer" },
      mine: false,
      body: "We will visit on Tuesday morning.",
      photos: [],
      readBy: [{ name: "Robin Ashdown", role: "tenant", readAt: "2026-01-12T14:05:00.000Z" }],
    },
    {
      id: 12,
      kind: "from-tenant",
      at: "2026-01-12T18:30:00.000Z",
      author: { name: "Robin Ashdown", role: "tenant" },
      mine: false,
      body: "Tuesday is fine, the side gate is open.",
      photos: [{ id: 7, url: "/api/photos/7", thumbnailUrl: "/api/photos/7/thumbnail" }],
      readBy: [],
    },
  ],
  unread: 1,
  readUpTo: 11,
};

function workspaceApi(user: (typeof users)[keyof typeof users] = users.officer, overrides: Routes = {}) {
  return mockApi({
    "GET /api/auth/me": { body: user },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/cases/42": { body: theCase },
    "GET /api/cases/42/events": { body: { events } },
    "GET /api/cases/42/photos": { body: { photos: [] } },
    "GET /api/cases/42/readings": { body: { readings } },
    "GET /api/cases/42/evaluation": { body: evaluation },
    "GET /api/cases/42/triage": { body: triage },
    "GET /api/cases/42/deadlines": { body: { deadlines: deadlinesBefore } },
    "GET /api/cases/42/inspections": { body: { inspections: [] } },
    "GET /api/cases/42/assessments": { body: { assessments: [] } },
    "GET /api/cases/42/related": { body: related },
    "GET /api/cases/42/messages": { body: conversation },
    "POST /api/cases/42/messages/read": { body: { unread: 0, readUpTo: 12 } },
    "GET /api/staff": { body: { users: staff } },
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

/** Opens the workspace, on one of its tabs when given (?tab=…, as a link would). */
async function openWorkspace(tab?: string) {
  const view = renderApp(tab ? `/cases/42?tab=${tab}` : "/cases/42");
  expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
  return view;
}

const region = (name: string) => screen.getByRole("region", { name });

/** Chooses a tab and waits for its panel (the tab is in the link, so choosing one is a navigation). */
async function openTab(user: ReturnType<typeof userEvent.setup>, name: string) {
  await user.click(screen.getByRole("tab", { name }));
  return screen.findByRole("tabpanel", { name });
}

/** Forms open on demand: the button in the section opens its form. */
async function openForm(user: ReturnType<typeof userEvent.setup>, section: HTMLElement, button: string) {
  await user.click(within(section).getByRole("button", { name: button }));
}

describe("case workspace", () => {
  beforeEach(() => clearCsrfToken());

  it("keys every query about a case under the case's own key, so refreshing a case refreshes the workspace", () => {
    const parts = Object.entries(caseKeys).filter(
      ([name]) => !["all", "lists", "mine", "queues", "queue", "details", "detail"].includes(name),
    );
    expect(parts.length).toBeGreaterThan(5);
    for (const [name, key] of parts)
      expect({ name, prefix: (key as (id: number) => readonly unknown[])(42).slice(0, 3) }).toEqual({
        name,
        prefix: caseKeys.detail(42),
      });
  });

  it("shows a member of staff the workspace at the tenant's address, with every section from the API", async () => {
    workspaceApi(users.officer, {
      "GET /api/cases/42/inspections": { body: { inspections: [inspection] } },
      "GET /api/cases/42/assessments": { body: { assessments } },
    });
    await openWorkspace();

    // Header, above every tab: address, status, priority, next deadline, assignee, risk, hazard class.
    expect(screen.getByText("1 Tanner Row, Easterby, ZX3 1AA")).toBeInTheDocument();
    const facts = within(region("Case summary")).getByText("Assigned to").closest("dl")!;
    expect(within(facts).getByText("Triaged")).toBeInTheDocument();
    expect(await within(facts).findByText(/^47/)).toHaveTextContent("47 out of 100");
    expect(within(facts).getByText("Risk").nextElementSibling).toHaveTextContent("Not known yet");
    expect(await within(facts).findByText("Priya Venn")).toBeInTheDocument();
    expect(within(facts).getByText("Significant hazard")).toBeInTheDocument();
    expect(await within(facts).findByText("Investigate")).toBeInTheDocument();
    expect(within(facts).getByText("Fri, 23 Jan 2099, 23:59 GMT")).toBeInTheDocument();

    // Triage: the score, every part with its points and reason, and what the score does not do.
    const triagePanel = region("Triage priority");
    expect(await within(triagePanel).findByText("47")).toBeInTheDocument();
    expect(within(triagePanel).getByText("out of 100")).toBeInTheDocument();
    const rows = within(triagePanel).getAllByRole("row").slice(1);
    expect(rows).toHaveLength(triage.parts.length);
    expect(rows[1]).toHaveTextContent("Vulnerable household");
    expect(rows[1]).toHaveTextContent("Children under 15 live here.");
    expect(rows[1]).toHaveTextContent("16 of 20");
    expect(within(triagePanel).getByText(/does not decide whether a report is investigated/)).toBeInTheDocument();

    // Deadlines: plain stage names, London time, the state in words.
    const deadlines = region("Deadlines");
    const stages = await within(deadlines).findAllByRole("listitem");
    expect(
      stages.map(
        (li) =>
          within(li).getByText(/^(Make safe|Investigate|Written summary|Safety work begun|Supplementary work begun)$/)
            .textContent,
      ),
    ).toEqual(["Make safe", "Investigate", "Written summary", "Safety work begun", "Supplementary work begun"]);
    expect(stages[0]).toHaveTextContent("Not applicable");
    expect(stages[1]).toHaveTextContent("Pending");
    expect(stages[1]).toHaveTextContent("Fri, 23 Jan 2099, 23:59 GMT");
    expect(stages[2]).toHaveTextContent("Starts when the inspection is recorded");
    expect(within(deadlines).getByText(/England social-housing default/)).toBeInTheDocument();

    // The tenant's report on the overview; the diagnosis hint and the engine's evaluation on Readings.
    expect(within(region("The tenant's report")).getByText("Black mould in the bedroom corner")).toBeInTheDocument();
    expect(region("The tenant's report")).toHaveTextContent(/Came in by: \w/);
    const user = userEvent.setup();
    await openTab(user, "Readings");
    const hints = region("Diagnosis hints");
    expect(await within(hints).findByText(/^Bedroom 1:/)).toBeInTheDocument();
    for (const reason of series.diagnosis.reasons) expect(within(hints).getByText(reason)).toBeInTheDocument();
    // The promise written for the tenant ("your landlord will look into…") is not repeated to staff.
    expect(within(region("What the readings show")).queryByText(evaluation.statement)).not.toBeInTheDocument();
    expect(within(region("What the readings show")).queryByText(/your landlord/i)).not.toBeInTheDocument();

    // Inspections and every HHSRS version, newest first.
    await openTab(user, "Inspection and assessment");
    const inspections = region("Recorded inspections");
    expect(await within(inspections).findByText(inspection.findings)).toBeInTheDocument();
    expect(within(inspections).getByText("Condensation")).toBeInTheDocument();
    expect(within(inspections).getByText(/11\.2 °C, 12\.0 °C, moisture 18\.0 WME/)).toBeInTheDocument();
    const versions = within(region("HHSRS assessment")).getAllByRole("heading", { level: 4 });
    expect(versions.map((h) => h.textContent)).toEqual([
      `Version 2 (latest): Category ${assessments[1]!.category}, band ${assessments[1]!.band}`,
      `Version 1: Category ${assessments[0]!.category}, band ${assessments[0]!.band}`,
    ]);

    // Timeline for staff: internal notes, and where each e-mail went and how it fared.
    await openTab(user, "Timeline");
    const timeline = region("Timeline");
    expect(await within(timeline).findByText("Key safe code is with the caretaker.")).toBeInTheDocument();
    expect(within(timeline).getByText("Priya Venn (Housing officer) added an internal note.")).toBeInTheDocument();
    expect(within(timeline).getAllByText("robin@example.org")).toHaveLength(3);
    expect(within(timeline).getAllByText(/Acknowledgement of the report/)).toHaveLength(2);
    expect(within(timeline).getByText("Failed to send: Mailbox unavailable")).toBeInTheDocument();
    expect(within(timeline).getAllByText(/^Sent at/)).toHaveLength(2);
    // An e-mail sent again says so, and its "Send again" stays with the e-mail's first entry.
    expect(
      within(timeline).getByText(
        "E-mail sent again by Priya Venn (Housing officer): “We have your report DW-2026-00042”, to robin@example.org.",
      ),
    ).toBeInTheDocument();
    expect(within(timeline).getAllByRole("button", { name: "Send the e-mail to robin@example.org again" })).toHaveLength(1);

    // Other cases at this home link to their own page.
    await openTab(user, "Overview");
    const relatedPanel = region("Other cases at this home");
    expect(await within(relatedPanel).findByRole("link", { name: "DW-2025-00017" })).toHaveAttribute("href", "/cases/17");
    expect(within(relatedPanel).getByText("Closed")).toBeInTheDocument();
  });

  it("offers only the status moves the workflow allows, asks for a reason to cancel, and shows the server's refusal", async () => {
    const refusal =
      "A case that is triaged cannot move to cancelled. From triaged it can move to: inspection-booked, investigated.";
    const { callsTo } = workspaceApi(users.officer, {
      "PATCH /api/cases/42": apiError(409, "conflict", refusal, { from: "triaged", to: "cancelled", allowed: [] }),
    });
    await openWorkspace();
    const actions = region("Actions");
    const user = userEvent.setup();
    await openForm(user, actions, "Change the status");
    const select = within(actions).getByLabelText(/^Move to/);
    const options = within(select).getAllByRole("option").slice(1);
    expect(options.map((o) => (o as HTMLOptionElement).value)).toEqual([...CASE_TRANSITIONS.triaged]);
    expect(options.map((o) => o.textContent)).toEqual(["Inspection booked", "Investigated", "Cancelled"]);

    await user.selectOptions(select, "cancelled");
    await user.click(within(actions).getByRole("button", { name: "Change status" }));
    expect(within(actions).getByText("Say why the case is being cancelled.")).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/cases/42")).toHaveLength(0);

    await user.type(within(actions).getByLabelText("Reason"), "Tenant moved out before the visit.");
    await user.click(within(actions).getByRole("button", { name: "Change status" }));
    const dialog = await screen.findByRole("dialog", { name: "Cancel this case?" });
    await user.click(within(dialog).getByRole("button", { name: "Cancel the case" }));
    expect(await within(actions).findByText(refusal)).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/cases/42")[0]!.body).toEqual({
      status: "cancelled",
      reason: "Tenant moved out before the visit.",
    });
  });

  it("changes the status and refreshes the case, its deadlines and triage", async () => {
    const { callsTo } = workspaceApi(users.officer, {
      "PATCH /api/cases/42": { body: { ...theCase, status: "inspection-booked" } },
      "GET /api/cases/42": (_c, nth) => ({ body: nth === 0 ? theCase : { ...theCase, status: "inspection-booked" } }),
    });
    await openWorkspace();
    await within(region("Triage priority")).findByText("47");
    const actions = region("Actions");
    const user = userEvent.setup();
    await openForm(user, actions, "Change the status");
    await user.selectOptions(within(actions).getByLabelText(/^Move to/), "inspection-booked");
    // A move by hand is an exception: it needs a reason.
    await user.click(within(actions).getByRole("button", { name: "Change status" }));
    expect(within(actions).getByText("Say why you are changing the status by hand.")).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/cases/42")).toHaveLength(0);
    await user.type(within(actions).getByLabelText("Reason"), "Visit arranged by phone with the tenant.");
    await user.click(within(actions).getByRole("button", { name: "Change status" }));
    expect(await within(actions).findByText("The status is now “Inspection booked”.")).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/cases/42")[0]!.body).toEqual({
      status: "inspection-booked",
      reason: "Visit arranged by phone with the tenant.",
    });
    await waitFor(() => {
      expect(callsTo("GET", "/api/cases/42/deadlines").length).toBeGreaterThanOrEqual(2);
      expect(callsTo("GET", "/api/cases/42/triage").length).toBeGreaterThanOrEqual(2);
    });
    // The timeline, marked stale, is fetched again when its tab is opened.
    await openTab(user, "Timeline");
    await waitFor(() => expect(callsTo("GET", "/api/cases/42/events").length).toBeGreaterThanOrEqual(2));
    await openTab(user, "Overview");
    // From the new status the workflow offers other moves.
    await waitFor(() =>
      expect(
        within(within(actions).getByLabelText(/^Move to/))
          .getAllByRole("option")
          .slice(1)
          .map((o) => (o as HTMLOptionElement).value),
      ).toEqual([...CASE_TRANSITIONS["inspection-booked"]]),
    );
  });

  it("assigns from the staff list and classifies the hazard only with a reason", async () => {
    const { callsTo } = workspaceApi(users.officer, {
      "PATCH /api/cases/42": (call) => ({ body: { ...theCase, ...(call.body as object) } }),
    });
    await openWorkspace();
    const actions = region("Actions");
    const user = userEvent.setup();
    await openForm(user, actions, "Assign the case");
    await openForm(user, actions, "Classify the hazard");
    const assignee = await within(actions).findByLabelText("Assigned to");
    expect(
      within(assignee)
        .getAllByRole("option")
        .map((o) => o.textContent),
    ).toEqual([
      "Nobody (unassigned)",
      "Priya Venn, Housing officer",
      "Dale Whitcombe, Maintenance lead",
      "Sam Okafor, Housing officer",
    ]);
    await user.selectOptions(assignee, "7");
    await user.click(within(actions).getByRole("button", { name: "Save assignee" }));
    expect(await within(actions).findByText("The case is now assigned to Sam Okafor.")).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/cases/42")[0]!.body).toEqual({ assigneeId: 7 });

    const group = within(actions).getByRole("group", { name: "How serious is the hazard?" });
    await user.click(within(group).getByRole("radio", { name: /^Emergency hazard/ }));
    await user.click(within(actions).getByRole("button", { name: "Save classification" }));
    expect(within(actions).getByText("Say why the hazard is classified this way.")).toBeInTheDocument();
    expect(within(actions).getByLabelText("Reason for this classification")).toHaveFocus();
    expect(callsTo("PATCH", "/api/cases/42")).toHaveLength(1);
    await user.type(within(actions).getByLabelText("Reason for this classification"), "Black mould over a baby's cot.");
    await user.click(within(actions).getByRole("button", { name: "Save classification" }));
    await waitFor(() => expect(callsTo("PATCH", "/api/cases/42")).toHaveLength(2));
    expect(callsTo("PATCH", "/api/cases/42")[1]!.body).toEqual({
      hazardClass: "emergency",
      reason: "Black mould over a baby's cot.",
    });
  });

  it("keeps a running total of the spread of harm and checks the assessment before sending it", async () => {
    const { callsTo } = workspaceApi(users.officer, {
      "POST /api/cases/42/assessments": (call) => {
        const body = call.body as { likelihood: number; spread: [number, number, number, number]; justification: string };
        const r = hhsrsScore(body);
        return {
          status: 201,
          body: {
            id: 9,
            version: 1,
            ...body,
            score: r.displayScore,
            band: r.band,
            category: r.category,
            assessorId: 2,
            createdAt: new Date().toISOString(),
          },
        };
      },
    });
    await openWorkspace("inspection");
    const panel = region("HHSRS assessment");
    const user = userEvent.setup();
    await openForm(user, panel, "New assessment");
    const classBox = (n: string) => within(panel).getByLabelText(new RegExp(`^Class ${n} \\(`));

    expect(within(panel).getByText(/Total: 0 % of 100 %/)).toBeInTheDocument();
    await user.type(classBox("I"), "1");
    await user.type(classBox("II"), "4.6");
    await user.type(classBox("III"), "21.5");
    expect(within(panel).getByText(/Total: 27.1 % of 100 %/)).toHaveTextContent("72.9 % still to place");

    await user.click(within(panel).getByRole("button", { name: "Save assessment" }));
    expect(within(panel).getByText("Choose the likelihood of a harmful occurrence.")).toBeInTheDocument();
    expect(within(panel).getByText("The four percentages must total 100; they total 27.1.")).toBeInTheDocument();
    expect(within(panel).getByText("Give the reasons for this judgement in a sentence or two.")).toBeInTheDocument();

    // Two classes off the representative points is one too many.
    await user.type(classBox("IV"), "70");
    await user.clear(classBox("III"));
    await user.type(classBox("III"), "24.4");
    expect(within(panel).getByText(/Total: 100 % of 100 %/)).toHaveTextContent("complete");
    await user.selectOptions(within(panel).getByLabelText(/^Likelihood/), "100");
    await user.type(within(panel).getByLabelText(/^Justification/), "Extensive mould in the room where the baby sleeps.");
    await user.click(within(panel).getByRole("button", { name: "Save assessment" }));
    expect(within(panel).getByText(/these classes are not on a point: III \(24\.4\), IV \(70\.0\)/)).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/assessments")).toHaveLength(0);

    await user.clear(classBox("III"));
    await user.type(classBox("III"), "21.5");
    await user.clear(classBox("IV"));
    await user.type(classBox("IV"), "72.9");
    await user.click(within(panel).getByRole("button", { name: "Save assessment" }));
    const expected = hhsrsScore({ likelihood: 100, spread: [1, 4.6, 21.5, 72.9] });
    expect(await within(panel).findByText("Assessment version 1 saved")).toBeInTheDocument();
    expect(within(panel).getByText(`Category ${expected.category}, band ${expected.band}`)).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/assessments")[0]!.body).toEqual({
      likelihood: 100,
      spread: [1, 4.6, 21.5, 72.9],
      justification: "Extensive mould in the room where the baby sleeps.",
    });
    await waitFor(() => expect(callsTo("GET", "/api/cases/42/assessments").length).toBeGreaterThanOrEqual(2));
  });

  it("keeps the written summary disabled, with the reason, until an inspection exists", async () => {
    const { callsTo } = workspaceApi();
    await openWorkspace("letters");
    const panel = region("Written summary");
    await openForm(userEvent.setup(), panel, "Write the written summary");
    expect(await within(panel).findByText("Record the inspection first")).toBeInTheDocument();
    expect(within(panel).getByLabelText(/^Summary for the tenant/)).toBeDisabled();
    expect(within(panel).getByRole("button", { name: "Send the written summary" })).toBeDisabled();
    expect(callsTo("POST", "/api/cases/42/summary")).toHaveLength(0);
  });

  it("drafts the summary from the case, refuses unfinished parts, confirms, and says when it was sent", async () => {
    const sentAt = "2026-01-15T14:30:00.000Z";
    const { callsTo } = workspaceApi(users.officer, {
      "GET /api/cases/42/inspections": { body: { inspections: [inspection] } },
      "GET /api/cases/42/assessments": { body: { assessments } },
      "GET /api/cases/42/deadlines": { body: { deadlines: deadlinesAfter } },
      "POST /api/cases/42/summary": { status: 201, body: { id: 3, sentAt } },
    });
    await openWorkspace("letters");
    const panel = region("Written summary");
    const user = userEvent.setup();
    await openForm(user, panel, "Write the written summary");
    const text = (await within(panel).findByLabelText(/^Summary for the tenant/)) as HTMLTextAreaElement;
    expect(text).toBeEnabled();
    // The officer's own notes stay out of the tenant's letter; the band letter and the zone name too.
    expect(text.value).not.toContain(inspection.findings);
    expect(text.value).toContain("[Fill in: what we found, in plain words for the tenant]");
    expect(text.value).toContain("Condensation: moisture in the air indoors");
    expect(text.value).toContain(`Category ${assessments[1]!.category} hazard`);
    expect(text.value).not.toMatch(/\bband\b|\bGMT\b|\bBST\b/);
    expect(text.value).toContain("begin the work to remove the risk to your health by the end of Wednesday 21 January 2099");

    await user.click(within(panel).getByRole("button", { name: "Send the written summary" }));
    expect(within(panel).getByText(/Fill in or remove every part marked/)).toBeInTheDocument();
    expect(text).toHaveFocus();

    await user.clear(text);
    await user.type(text, "We found condensation on the cold external wall. We will fit a new extractor fan by 21 January.");
    await user.click(within(panel).getByRole("button", { name: "Send the written summary" }));
    const dialog = await screen.findByRole("dialog", { name: "Send the written summary to the tenant?" });
    await user.click(within(dialog).getByRole("button", { name: "Send it" }));
    expect(await within(panel).findByText("Sent at Thu, 15 Jan 2026, 14:30 GMT")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/summary")[0]!.body).toEqual({
      body: "We found condensation on the cold external wall. We will fit a new extractor fan by 21 January.",
    });
  });

  it("records an inspection with readings room by room", async () => {
    const { callsTo } = workspaceApi(users.officer, {
      "POST /api/cases/42/inspections": {
        status: 201,
        body: { id: 6, inspectedAt: "2026-01-14T10:00:00.000Z", cause: "condensation", mouldExtent: "under-1-m2" },
      },
    });
    await openWorkspace("inspection");
    const panel = region("Inspections");
    const user = userEvent.setup();
    expect(await within(panel).findByText("No inspection recorded yet")).toBeInTheDocument();
    await openForm(user, panel, "Record an inspection");

    await user.click(within(panel).getByRole("button", { name: "Record inspection" }));
    expect(within(panel).getByText("Choose the cause you found, or “Other or not yet known”.")).toBeInTheDocument();
    expect(within(panel).getByText("Describe what you found in a sentence or two.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/inspections")).toHaveLength(0);

    const when = within(panel).getByLabelText(/^When the inspection took place/);
    await user.clear(when);
    await user.type(when, "2026-01-14T10:00");
    await user.click(within(panel).getByRole("radio", { name: /^Condensation/ }));
    await user.click(within(panel).getByRole("radio", { name: "Less than 1 m²" }));
    await user.type(within(panel).getByLabelText(/^Findings/), "Mould on the window reveal in the bedroom.");

    await user.click(within(panel).getByRole("button", { name: "Add a room" }));
    await user.click(within(panel).getByRole("button", { name: "Add a room" }));
    const rows = within(panel).getAllByRole("group", { name: /^Room \d/ });
    expect(rows).toHaveLength(2);
    expect(within(rows[0]!).getByLabelText("Room")).toHaveValue("1");
    expect(within(rows[1]!).getByLabelText("Room")).toHaveValue("2");
    await user.click(within(rows[0]!).getByRole("button", { name: /^Remove/ }));
    const bedroom = within(panel).getByRole("group", { name: "Room 1: Bedroom 1" });
    await user.type(within(bedroom).getByLabelText(/^Relative humidity/), "140");
    await user.click(within(panel).getByRole("button", { name: "Record inspection" }));
    expect(within(bedroom).getByText("Relative humidity should be more than 0 and at most 100 %.")).toBeInTheDocument();

    await user.clear(within(bedroom).getByLabelText(/^Relative humidity/));
    await user.type(within(bedroom).getByLabelText(/^Relative humidity/), "74");
    await user.type(within(bedroom).getByLabelText(/^Air temperature/), "17,5");
    await user.type(within(bedroom).getByLabelText(/^Surface temperatures/), "11.2 12");
    await user.type(within(bedroom).getByLabelText(/^Moisture meter reading/), "18");
    await user.selectOptions(within(bedroom).getByLabelText("Unit"), "wme");
    await user.click(within(panel).getByRole("button", { name: "Record inspection" }));

    expect(await within(panel).findByText(/Inspection of .* recorded\./)).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/inspections")[0]!.body).toEqual({
      // 10:00 in London in January is 10:00 UTC (GMT).
      inspectedAt: "2026-01-14T10:00:00.000Z",
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "Mould on the window reveal in the bedroom.",
      roomReadings: [
        {
          roomId: 2,
          airTemperatureC: 17.5,
          relativeHumidityPct: 74,
          surfaceTemperaturesC: [11.2, 12],
          moisture: { value: 18, unit: "wme" },
        },
      ],
    });
    await waitFor(() => {
      expect(callsTo("GET", "/api/cases/42/inspections").length).toBeGreaterThanOrEqual(2);
      expect(callsTo("GET", "/api/cases/42/deadlines").length).toBeGreaterThanOrEqual(2);
    });
  });

  it("shows the conversation with what is new, marks it read, and says who has read the staff's messages", async () => {
    const { callsTo } = workspaceApi(users.officer);
    await openWorkspace("letters");
    const panel = region("Messages and notes");
    expect(await within(panel).findByText("1 new message from the tenant since you last looked.")).toBeInTheDocument();
    const thread = within(panel).getByRole("list", { name: "Messages, oldest first" });
    const [staffMessage, tenantMessage] = within(thread).getAllByRole("article");
    expect(staffMessage).toHaveTextContent("Read by the tenant 12 Jan 2026, 14:05");
    expect(tenantMessage).toHaveTextContent("Robin Ashdown (tenant)");
    expect(tenantMessage).toHaveTextContent("New");
    expect(tenantMessage).toHaveTextContent("Not read by staff yet");
    expect(within(tenantMessage!).getByRole("img", { name: /Attachment 1 of 1/ })).toHaveAttribute(
      "src",
      "/api/photos/7/thumbnail",
    );
    await waitFor(() => expect(callsTo("POST", "/api/cases/42/messages/read")).toHaveLength(1));
    expect(callsTo("POST", "/api/cases/42/messages/read")[0]!.body).toEqual({ upTo: 12 });
  });

  it("makes the author choose between a message to the tenant and an internal note", async () => {
    const { callsTo } = workspaceApi(users.officer, {
      "POST /api/cases/42/messages": { status: 201, body: { ok: true, id: 13 } },
    });
    await openWorkspace("letters");
    const panel = region("Messages and notes");
    const user = userEvent.setup();
    await user.type(within(panel).getByLabelText("Message"), "Caretaker has the key.");
    await user.click(within(panel).getByRole("button", { name: "Send" }));
    expect(within(panel).getByText("Choose whether this goes to the tenant or stays with staff.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/messages")).toHaveLength(0);

    await user.click(within(panel).getByRole("radio", { name: /^Staff only/ }));
    await user.click(within(panel).getByRole("button", { name: "Add internal note" }));
    expect(await within(panel).findByText("Internal note added. Only staff can see it.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/messages")[0]!.body).toEqual({ body: "Caretaker has the key.", internal: true });
    expect(within(panel).getByRole("radio", { name: /^The tenant/ })).not.toBeChecked();
  });

  it("lets a maintenance lead read the case without the officer's actions", async () => {
    workspaceApi(users.maintenance, { "GET /api/cases/42/inspections": { body: { inspections: [inspection] } } });
    await openWorkspace();
    expect(
      screen.getByText("Only housing officers and administrators can change the status, the assignee or the hazard class."),
    ).toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Change the status" })).not.toBeInTheDocument();
    const user = userEvent.setup();
    await openTab(user, "Inspection and assessment");
    expect(screen.queryByRole("button", { name: "Record an inspection" })).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "New assessment" })).not.toBeInTheDocument();
    expect(await within(region("Inspections")).findByText(inspection.findings)).toBeInTheDocument();
    await openTab(user, "Letters and messages");
    await openForm(user, region("Written summary"), "Read the draft of the written summary");
    expect(await within(region("Written summary")).findByRole("button", { name: "Send the written summary" })).toBeDisabled();
    expect(within(region("Messages and notes")).getByRole("button", { name: "Send" })).toBeEnabled();
  });

  it("moves between tabs with the arrow keys, keeps the tab in the link, and opens a form on demand", async () => {
    workspaceApi();
    const { router } = await openWorkspace();
    const user = userEvent.setup();
    const tabs = screen.getByRole("tablist", { name: "Parts of the case" });
    expect(
      within(tabs)
        .getAllByRole("tab")
        .map((t) => t.textContent),
    ).toEqual(["Overview", "Readings", "Inspection and assessment", "Letters and messages", "Works", "Timeline"]);
    const overview = within(tabs).getByRole("tab", { name: "Overview" });
    expect(overview).toHaveAttribute("aria-selected", "true");
    // One tab stop: the chosen tab; the others are reached with the arrow keys.
    expect(
      within(tabs)
        .getAllByRole("tab")
        .filter((t) => t.tabIndex === 0),
    ).toEqual([overview]);
    expect(screen.getByRole("tabpanel", { name: "Overview" })).toContainElement(region("Deadlines"));

    overview.focus();
    await user.keyboard("{ArrowRight}");
    const readings = within(tabs).getByRole("tab", { name: "Readings" });
    expect(readings).toHaveFocus();
    await waitFor(() => expect(readings).toHaveAttribute("aria-selected", "true"));
    expect(await screen.findByRole("tabpanel", { name: "Readings" })).toBeInTheDocument();
    expect(screen.queryByRole("region", { name: "Deadlines" })).not.toBeInTheDocument();
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get("tab")).toBe("readings"));
    await user.keyboard("{End}");
    expect(within(tabs).getByRole("tab", { name: "Timeline" })).toHaveFocus();
    await user.keyboard("{ArrowRight}");
    expect(overview).toHaveFocus();
    await waitFor(() => expect(router.state.location.search).toBe(""));
    await user.keyboard("{ArrowLeft}");
    await waitFor(() => expect(within(tabs).getByRole("tab", { name: "Timeline" })).toHaveAttribute("aria-selected", "true"));

    // Inspection: the form is closed until asked for; Cancel closes it and focus goes back to its button.
    await user.click(within(tabs).getByRole("tab", { name: "Inspection and assessment" }));
    const panel = await screen.findByRole("region", { name: "Inspections" });
    expect(within(panel).queryByLabelText(/^Findings/)).not.toBeInTheDocument();
    await openForm(user, panel, "Record an inspection");
    expect(within(panel).getByLabelText(/^Findings/)).toBeInTheDocument();
    expect(within(panel).queryByRole("button", { name: "Record an inspection" })).not.toBeInTheDocument();
    await user.click(within(panel).getByRole("button", { name: /^Cancel/ }));
    expect(within(panel).queryByLabelText(/^Findings/)).not.toBeInTheDocument();
    expect(within(panel).getByRole("button", { name: "Record an inspection" })).toHaveFocus();
  });

  it("says when a section could not be loaded, and still shows the rest", async () => {
    workspaceApi(users.officer, {
      "GET /api/cases/42/triage": apiError(404, "not_found", "The priority could not be worked out."),
    });
    await openWorkspace();
    const triagePanel = region("Triage priority");
    expect(await within(triagePanel).findByText("We couldn't load the triage priority")).toBeInTheDocument();
    expect(within(triagePanel).getByText("The priority could not be worked out.")).toBeInTheDocument();
    expect(await within(region("Deadlines")).findByText("Investigate")).toBeInTheDocument();
  });

  it("says a case is not found rather than showing another landlord's", async () => {
    workspaceApi(users.officer, { "GET /api/cases/43": apiError(404, "not_found", "No such case.") });
    renderApp("/cases/43");
    expect(await screen.findByRole("heading", { level: 1, name: "Case not found" })).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Go to Case queue" })).toHaveAttribute("href", "/queue");
  });
});
