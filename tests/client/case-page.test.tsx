import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { evaluatePoint, evaluateSeries } from "@/lib/domain";
import { clearCsrfToken } from "@/lib/api-client";
import { worseResponse } from "@/lib/contracts";
import { mockApi, mockReply, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const homeRooms = [
  { id: 1, name: "Living room", kind: "living" },
  { id: 2, name: "Bedroom 1", kind: "bedroom" },
];

const theCase = {
  id: 42,
  reference: "DW-2026-00042",
  status: "triaged",
  // The server sends these to the tenant too (see GET /api/cases/:id in src/lib/contracts/cases.ts).
  assigneeId: null,
  hazardClass: null,
  hazardClassReason: null,
  tenantUserId: users.tenant.id,
  channel: "tenant-online",
  awareAt: "2026-01-10T08:00:00.000Z",
  createdAt: "2026-01-10T08:00:00.000Z",
  description: "Black mould in the bedroom corner",
  locations: ["corner", "window"],
  observations: ["mould-spots", "condensation"],
  since: "months",
  area: "a4",
  vulnerability: ["children-under-15"],
  equipment: { heatingUsable: "yes", extractorFanWorks: "none-fitted" },
  property: {
    id: 5,
    addressLine1: "1 Tanner Row",
    addressLine2: null,
    town: "Easterby",
    postcode: "ZX3 1AA",
    estate: "Millbeck Terraces",
  },
  rooms: [{ id: 2, name: "Bedroom 1", kind: "bedroom" }],
  homeRooms,
};

const tenantActor = { name: users.tenant.name, role: "tenant" };
const officer = { name: "Priya Venn", role: "officer" };
const events = [
  { id: 1, type: "case-created", at: "2026-01-10T08:00:00.000Z", actor: tenantActor, before: null, after: null },
  {
    id: 2,
    type: "email-queued",
    at: "2026-01-10T08:00:01.000Z",
    actor: null,
    before: null,
    after: { outboxId: 9, to: "officers@example.org", template: "case-new" },
  },
  { id: 3, type: "photos-added", at: "2026-01-10T08:01:00.000Z", actor: tenantActor, before: null, after: { photoIds: [7, 8] } },
  {
    id: 4,
    type: "readings-imported",
    at: "2026-01-11T09:00:00.000Z",
    actor: tenantActor,
    before: null,
    after: { importId: 3, imported: 48, duplicates: 0, rejected: 2, roomId: 2 },
  },
  {
    id: 5,
    type: "status-changed",
    at: "2026-01-12T10:00:00.000Z",
    actor: officer,
    before: { status: "new" },
    after: { status: "triaged" },
  },
  {
    id: 6,
    type: "message-to-tenant",
    at: "2026-01-12T10:05:00.000Z",
    actor: officer,
    before: null,
    after: { body: "We will visit on Tuesday morning." },
  },
  {
    id: 8,
    type: "email-resent",
    at: "2026-01-11T12:00:00.000Z",
    actor: officer,
    before: null,
    after: { outboxId: 9, to: users.tenant.email, template: "caseAcknowledgement", subject: "We have your report" },
  },
  { id: 7, type: "survey-scheduled", at: "2026-01-12T11:00:00.000Z", actor: officer, before: null, after: {} },
].map((e) => ({ ...e, email: null }));

const photo = (id: number) => ({
  id,
  url: `/api/photos/${id}`,
  thumbnailUrl: `/api/photos/${id}/thumbnail`,
  width: 1600,
  height: 1200,
  sha256: "cd".repeat(32),
  workOrderId: null,
  createdAt: "2026-01-10T08:01:00.000Z",
});

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
const latest = readings[readings.length - 1]!;

// The evaluation is the engine's own output for these readings, as the server would send it.
const evaluation = {
  statement: "Your landlord will look into this report whatever the readings show: readings help us understand the cause.",
  rooms: [
    {
      roomId: 2,
      roomName: "Bedroom 1",
      readingsCount: readings.length,
      latest: {
        takenAt: latest.takenAt,
        airTemperatureC: latest.airTemperatureC,
        relativeHumidityPct: latest.relativeHumidityPct,
        surfaceTemperatureC: latest.surfaceTemperatureC,
        outdoorTemperatureC: latest.outdoorTemperatureC,
      },
      surfaces: [
        {
          element: "corner-thermal-bridge",
          label: "External corner of a solid wall (thermal bridge) (measured surface)",
          result: evaluatePoint({
            airTemperatureC: 18,
            relativeHumidityPct: 72,
            surfaceTemperatureC: 12.5,
            outdoorTemperatureC: 4,
            element: "corner-thermal-bridge",
          }),
        },
      ],
      series: evaluateSeries({
        readings: readings.map((r) => ({
          at: r.takenAt,
          airTemperatureC: r.airTemperatureC,
          relativeHumidityPct: r.relativeHumidityPct,
          surfaceTemperatureC: r.surfaceTemperatureC,
          outdoorTemperatureC: r.outdoorTemperatureC,
        })),
        element: "corner-thermal-bridge",
      }),
    },
  ],
};

// The conversation as the tenant sees it (GET /api/cases/42/messages): the officer's message, not read yet.
const conversation = {
  messages: [
    {
      id: 6,
      kind: "to-tenant",
      at: "2026-01-12T10:05:00.000Z",
      author: officer,
      mine: false,
      body: "We will visit on Tuesday morning.",
      photos: [],
      readBy: [],
    },
  ],
  unread: 1,
  readUpTo: null,
};

function caseApi(overrides: Record<string, MockReply | ((call: RecordedCall, nth: number) => MockReply)> = {}) {
  return mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/cases/42": { body: theCase },
    "GET /api/cases/42/events": { body: { events } },
    "GET /api/cases/42/photos": { body: { photos: [photo(7), photo(8)] } },
    "GET /api/cases/42/readings": { body: { readings } },
    "GET /api/cases/42/evaluation": { body: evaluation },
    "GET /api/cases/42/messages": { body: conversation },
    "POST /api/cases/42/messages/read": { body: { unread: 0, readUpTo: 6 } },
    ...overrides,
  });
}

async function openCase() {
  const view = renderApp("/cases/42");
  expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
  return view;
}

/** The parts below the latest message are behind their headings: pressing one opens it. */
async function openSection(user: ReturnType<typeof userEvent.setup>, name: string) {
  const button = screen.getByRole("button", { name });
  await user.click(button);
  expect(button).toHaveAttribute("aria-expanded", "true");
  return screen.getByRole("region", { name });
}

describe("case page", () => {
  beforeEach(() => clearCsrfToken());

  it("tells the story of the case in plain sentences, with the landlord's messages", async () => {
    caseApi();
    await openCase();
    expect(screen.getAllByText("Being looked into").length).toBeGreaterThan(0);
    const user = userEvent.setup();

    const timeline = await openSection(user, "What has happened so far");
    const entries = await within(timeline).findAllByRole("listitem");
    expect(entries).toHaveLength(events.length);
    // Newest first.
    expect(entries[0]).toHaveTextContent("Survey scheduled, by Priya Venn (Housing officer).");
    expect(within(timeline).getByText("You sent this report.")).toBeInTheDocument();
    expect(within(timeline).getByText("An e-mail about this report was sent.")).toBeInTheDocument();
    expect(within(timeline).getByText("An e-mail about this report was sent to you again.")).toBeInTheDocument();
    expect(within(timeline).queryByText(/officers@example\.org/)).not.toBeInTheDocument();
    expect(within(timeline).getByText("2 photos were added by you.")).toBeInTheDocument();
    expect(within(timeline).getByText("48 readings were added from a logger file for Bedroom 1.")).toBeInTheDocument();
    expect(within(timeline).getByText("2 rows of the file couldn't be read.")).toBeInTheDocument();
    expect(within(timeline).getByText("The status changed to “Being looked into”.")).toBeInTheDocument();

    // The conversation waits under its heading, one press away.
    const messages = await openSection(user, "Messages with your landlord");
    expect(await within(messages).findByText("We will visit on Tuesday morning.")).toBeInTheDocument();
    expect(within(messages).getByText(/Priya Venn, Housing officer/)).toBeInTheDocument();
    expect(within(messages).getByText("1 new message from your landlord since you last looked.")).toBeInTheDocument();
    // Tenants never see read receipts.
    expect(within(messages).queryByText(/Read by|Not read/)).not.toBeInTheDocument();

    const answers = await openSection(user, "What you told us");
    expect(within(answers).getByText("A corner of the room")).toBeInTheDocument();
    expect(within(answers).getByText("Children under 15")).toBeInTheDocument();
    expect(within(answers).getByText("There isn't one")).toBeInTheDocument();
  });

  it("lets the tenant write to the landlord, checking the message and each photo first", async () => {
    const { callsTo } = caseApi({
      "POST /api/cases/42/photos": { status: 201, body: { photos: [photo(9)], refused: [] } },
      "POST /api/cases/42/messages": { status: 201, body: { ok: true, id: 20 } },
    });
    await openCase();
    const user = userEvent.setup({ applyAccept: false });
    const panel = await openSection(user, "Messages with your landlord");
    await user.click(within(panel).getByRole("button", { name: "Send to your landlord" }));
    expect(within(panel).getByText("Write the message.")).toBeInTheDocument();
    expect(within(panel).getByLabelText("Write to your landlord")).toHaveFocus();
    expect(callsTo("POST", "/api/cases/42/messages")).toHaveLength(0);

    await user.upload(within(panel).getByLabelText(/^Photos/), [
      new File(["plain text"], "notes.txt", { type: "text/plain" }),
      new File(["jpeg bytes"], "wall.jpg", { type: "image/jpeg" }),
    ]);
    expect(within(panel).getByText("1 file was left out")).toBeInTheDocument();
    expect(
      within(panel)
        .getByText(/notes\.txt/)
        .closest("li"),
    ).toHaveTextContent("Choose a JPEG, PNG, WebP or AVIF photo.");
    expect(within(panel).getByRole("list", { name: "Photos to send with the message" })).toHaveTextContent("wall.jpg");

    await user.type(within(panel).getByLabelText("Write to your landlord"), "The patch came back overnight.");
    await user.click(within(panel).getByRole("button", { name: "Send to your landlord" }));
    expect(await within(panel).findByText(/Message sent with 1 photo\. Your landlord has been e-mailed/)).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/photos")).toHaveLength(1);
    expect(callsTo("POST", "/api/cases/42/messages")[0]!.body).toEqual({ body: "The patch came back overnight.", photoIds: [9] });
    expect(within(panel).getByLabelText("Write to your landlord")).toHaveValue("");
  });

  it("says so kindly when there are no messages yet", async () => {
    caseApi({ "GET /api/cases/42/messages": { body: { messages: [], unread: 0, readUpTo: null } } });
    await openCase();
    const messages = await openSection(userEvent.setup(), "Messages with your landlord");
    expect(await within(messages).findByText("No messages yet")).toBeInTheDocument();
  });

  it("leads with what happens next and the latest letter, with the rest closed under plain headings", async () => {
    const summary = {
      id: 20,
      type: "summary-sent",
      at: "2026-01-14T09:00:00.000Z",
      actor: { name: "Priya Venn", role: "officer" },
      before: null,
      after: { body: "We found condensation on the cold wall. We will fit a fan by 21 January." },
      email: null,
    };
    caseApi({ "GET /api/cases/42/events": { body: { events: [...events, summary] } } });
    await openCase();
    const messages = screen.getByRole("region", { name: "Latest from your landlord" });
    // The written summary is the newest: it shows in full; the older message waits behind a button.
    expect(await within(messages).findByText(/We will fit a fan by 21 January/)).toBeInTheDocument();
    expect(within(messages).getByText("Written summary of the investigation")).toBeInTheDocument();
    expect(within(messages).queryByText("We will visit on Tuesday morning.")).not.toBeInTheDocument();
    await userEvent.setup().click(within(messages).getByRole("button", { name: "Show the earlier message" }));
    expect(within(messages).getByText("We will visit on Tuesday morning.")).toBeInTheDocument();

    // The order of the page: what happens next, the latest from the landlord, then the rest, closed.
    const headings = screen.getAllByRole("heading", { level: 2 }).map((h) => h.textContent);
    expect(headings.indexOf("What happens next")).toBeLessThan(headings.indexOf("Latest from your landlord"));
    const rest = ["What your readings show", "Readings", "Photos", "What has happened so far", "Complaint", "What you told us"];
    // Then the conversation, open to write in.
    expect(headings[headings.indexOf("Latest from your landlord") + 1]).toBe("Messages with your landlord");
    expect(headings.slice(headings.indexOf("Messages with your landlord") + 1)).toEqual(rest);
    for (const name of rest) expect(screen.getByRole("button", { name })).toHaveAttribute("aria-expanded", "false");
    // Closed, they still say what is inside.
    expect(await screen.findByText("48 readings, with a chart.")).toBeInTheDocument();
    expect(screen.getByText("2 photos.")).toBeInTheDocument();
  });

  it("shows the engine's result per room and surface, with the cautions and the promise to investigate", async () => {
    caseApi();
    await openCase();
    const panel = await openSection(userEvent.setup(), "What your readings show");
    expect(await within(panel).findByRole("heading", { level: 3, name: "Bedroom 1" })).toBeInTheDocument();
    const result = evaluation.rooms[0]!.surfaces[0]!.result;
    expect(result.surface.state).toBe("condensing");
    expect(within(panel).getByText("Condensing")).toBeInTheDocument();
    expect(within(panel).getByText(`${result.dewPointC.toFixed(1)} °C`)).toBeInTheDocument();
    expect(within(panel).getByText(evaluation.statement)).toBeInTheDocument();
    expect(
      within(panel).getByText(/Whatever these numbers say, if you see damp or mould, tell your landlord/),
    ).toBeInTheDocument();
    expect(within(panel).getByRole("heading", { name: "Keeping safe" })).toBeInTheDocument();
    // The readings over time, in words.
    for (const reason of evaluation.rooms[0]!.series.diagnosis.reasons)
      expect(within(panel).getByText(reason)).toBeInTheDocument();
  });

  it("shows the photos and opens one full size in a dialog that Escape closes", async () => {
    caseApi();
    await openCase();
    const user = userEvent.setup();
    const photos = await openSection(user, "Photos");
    const first = await within(photos).findByRole("button", { name: /Open photo 1 of 2/ });
    expect(within(first).getByRole("presentation", { hidden: true })).toHaveAttribute("src", "/api/photos/7/thumbnail");

    await user.click(first);
    const dialog = await screen.findByRole("dialog", { name: "Photo 1 of 2" });
    expect(within(dialog).getByRole("img", { name: /^1 of 2, added/ })).toHaveAttribute("src", "/api/photos/7");
    await user.click(within(dialog).getByRole("button", { name: /Next photo/ }));
    expect(within(dialog).getByRole("img", { name: /^2 of 2, added/ })).toHaveAttribute("src", "/api/photos/8");
    await user.keyboard("{Escape}");
    await waitFor(() => expect(screen.queryByRole("dialog")).not.toBeInTheDocument());
    expect(first).toHaveFocus();
  });

  it("lists the readings with dew point and surface humidity worked out in the browser", async () => {
    caseApi();
    await openCase();
    await screen.findByText("48 readings, with a chart.");
    await openSection(userEvent.setup(), "Readings");
    const table = await screen.findByRole("table", { name: /Readings in Bedroom 1, newest first/ });
    const rows = within(table).getAllByRole("row");
    expect(rows).toHaveLength(1 + 25);
    // 18 °C at 72 % has a dew point of about 12.9 °C; a 12.5 °C surface is below it (about 102 %),
    // which is said as condensing, never as a percentage over 100.
    expect(within(rows[1]!).getByText("12.9 °C")).toBeInTheDocument();
    expect(within(rows[1]!).getByText("condensing (the surface is below the dew point)")).toBeInTheDocument();
    expect(table.textContent).not.toMatch(/\b(1\d\d|[2-9]\d\d) %/);
    expect(screen.getByText("Showing 1–25 of 48 readings")).toBeInTheDocument();
    await userEvent.setup().click(screen.getByRole("button", { name: /Next page/ }));
    expect(screen.getByText("Showing 26–48 of 48 readings")).toBeInTheDocument();
  });

  it("sends “It's got worse” with a note and refreshes the timeline", async () => {
    const { callsTo } = caseApi({
      "POST /api/cases/42/worse": { body: mockReply(worseResponse, { status: "triaged", reopened: true, told: "officers" }) },
    });
    await openCase();
    await screen.findByText("We will visit on Tuesday morning.");
    const user = userEvent.setup();
    const open = screen.getByRole("button", { name: "It's got worse" });
    await user.click(open);
    const dialog = await screen.findByRole("dialog", { name: "Tell your landlord it has got worse" });
    const note = within(dialog).getByLabelText("What has changed?");
    expect(note).toHaveFocus();
    await user.click(within(dialog).getByRole("button", { name: "Send to my landlord" }));
    expect(within(dialog).getByText("Tell us briefly what has changed.")).toBeInTheDocument();
    await user.type(note, "The mould has spread to the wardrobe.");
    await user.click(within(dialog).getByRole("button", { name: "Send to my landlord" }));

    expect(await screen.findByText("Thank you, your landlord has been told")).toBeInTheDocument();
    expect(screen.getByText(/Your report has been reopened/)).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/worse")[0]!.body).toEqual({ note: "The mould has spread to the wardrobe." });
    await waitFor(() => expect(callsTo("GET", "/api/cases/42/events").length).toBeGreaterThanOrEqual(2));
    expect(open).toHaveFocus();
  });

  it("says “Inspected” once the home has been looked at, not “Sent”", async () => {
    caseApi({ "GET /api/cases/42": { body: { ...theCase, status: "investigated" } } });
    await openCase();
    expect(await screen.findByText("Inspected")).toBeInTheDocument();
    expect(screen.queryByText("Sent")).not.toBeInTheDocument();
  });

  it("says the findings have been sent once the written summary has gone", async () => {
    const summary = {
      id: 8,
      type: "summary-sent",
      at: "2026-01-14T10:00:00.000Z",
      actor: officer,
      before: null,
      after: { summaryId: 1, body: "We found condensation mould." },
      email: null,
    };
    caseApi({
      "GET /api/cases/42": { body: { ...theCase, status: "investigated" } },
      "GET /api/cases/42/events": { body: { events: [...events, summary] } },
    });
    await openCase();
    expect(await screen.findByText("Findings sent to you")).toBeInTheDocument();
    expect(screen.getByText(/has written to you about what was found/)).toBeInTheDocument();
  });

  it("does not say the landlord was told when nobody could be e-mailed", async () => {
    caseApi({
      "POST /api/cases/42/worse": { body: mockReply(worseResponse, { status: "triaged", reopened: false, told: "nobody" }) },
    });
    await openCase();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "It's got worse" }));
    const dialog = await screen.findByRole("dialog", { name: "Tell your landlord it has got worse" });
    await user.type(within(dialog).getByLabelText("What has changed?"), "Now on the ceiling too.");
    await user.click(within(dialog).getByRole("button", { name: "Send to my landlord" }));
    expect(await screen.findByText("Thank you, this is now part of your report")).toBeInTheDocument();
    expect(screen.queryByText("Thank you, your landlord has been told")).not.toBeInTheDocument();
  });

  it("adds a reading by hand from the case page and works out the readings again", async () => {
    const { callsTo } = caseApi({
      "POST /api/cases/42/readings": { status: 201, body: { imported: 1, duplicates: 0, rejected: 0 } },
    });
    await openCase();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Add readings" }));
    const panel = screen.getByRole("region", { name: "Add more readings" });
    await user.click(within(panel).getByRole("button", { name: "Add this reading" }));
    expect(within(panel).getByText("Choose the room the reading was taken in.")).toBeInTheDocument();
    expect(within(panel).getByLabelText("Room")).toHaveFocus();
    await user.selectOptions(within(panel).getByLabelText("Room"), "Living room");
    await user.type(within(panel).getByLabelText("Air temperature (°C)"), "21,5");
    await user.type(within(panel).getByLabelText("Relative humidity (%)"), "55");
    expect(within(panel).getByText("Dry")).toBeInTheDocument();
    await user.click(within(panel).getByRole("button", { name: "Add this reading" }));

    expect(await within(panel).findByText("Reading added for Living room.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/readings")[0]!.body).toEqual([
      { roomId: 1, takenAt: expect.stringMatching(/Z$/), airTemperatureC: 21.5, relativeHumidityPct: 55 },
    ]);
    await waitFor(() => expect(callsTo("GET", "/api/cases/42/evaluation").length).toBeGreaterThanOrEqual(2));
    await user.click(within(panel).getByRole("button", { name: /^Close/ }));
    expect(screen.getByRole("button", { name: "Add readings" })).toHaveFocus();
  });

  it("adds photos from the case page, with the server's message when one is refused", async () => {
    const tooBig = "This photo is larger than 15 MB.";
    const { callsTo } = caseApi({
      "POST /api/cases/42/photos": (_call, nth) =>
        nth === 0
          ? { status: 413, body: { error: { code: "payload_too_large", message: tooBig } } }
          : { status: 201, body: { photos: [photo(9)], refused: [] } },
    });
    await openCase();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Add photos" }));
    const panel = screen.getByRole("region", { name: "Add more photos" });
    await user.upload(
      within(panel).getByLabelText("Add photos"),
      new File([new Uint8Array([0xff, 0xd8, 0xff])], "mould.jpg", { type: "image/jpeg" }),
    );
    await user.click(within(panel).getByRole("button", { name: "Send photo" }));
    expect(await within(panel).findByText(tooBig)).toBeInTheDocument();
    await user.click(within(panel).getByRole("button", { name: "Send photo" }));
    expect(await within(panel).findByText("1 photo added")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/photos")).toHaveLength(2);
    await waitFor(() => expect(callsTo("GET", "/api/cases/42/photos").length).toBeGreaterThanOrEqual(2));
  });

  it("keeps the photos the server took and names each file it refused, with its reason", async () => {
    const unreadable = "This photo could not be read: it may be damaged or only partly uploaded. Please try again.";
    const { callsTo } = caseApi({
      "POST /api/cases/42/photos": {
        status: 201,
        body: { photos: [photo(9)], refused: [{ name: "broken.jpg", reason: unreadable }] },
      },
    });
    await openCase();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Add photos" }));
    const panel = screen.getByRole("region", { name: "Add more photos" });
    const jpeg = (name: string) => new File([new Uint8Array([0xff, 0xd8, 0xff])], name, { type: "image/jpeg" });
    await user.upload(within(panel).getByLabelText("Add photos"), [jpeg("wall.jpg"), jpeg("broken.jpg")]);
    await user.click(within(panel).getByRole("button", { name: "Send 2 photos" }));
    expect(await within(panel).findByText("1 photo added")).toBeInTheDocument();
    expect(within(panel).getByText("One file could not be added")).toBeInTheDocument();
    expect(within(panel).getByText("broken.jpg")).toBeInTheDocument();
    expect(within(panel).getByText(unreadable, { exact: false })).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/photos")).toHaveLength(1);
  });

  it("says a report is not found rather than showing someone else's", async () => {
    caseApi({ "GET /api/cases/43": { status: 404, body: { error: { code: "not_found", message: "No such case." } } } });
    renderApp("/cases/43");
    expect(await screen.findByRole("heading", { level: 1, name: "Report not found" })).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Go to My reports" })).toHaveAttribute("href", "/cases");
  });
});
