import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { draftKey } from "@/features/report/lib/draft";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, makeProperty, mockApi, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const myHome = {
  tenancy: { id: 4, startDate: "2021-04-12", endDate: null },
  property: {
    ...makeProperty(5, { addressLine1: "1 Tanner Row", addressLine2: null, estate: "Millbeck Terraces", block: null }),
    rooms: [
      { id: 1, name: "Living room", kind: "living" },
      { id: 2, name: "Bedroom 1", kind: "bedroom" },
    ],
  },
};

const created = {
  id: 42,
  reference: "DW-2026-00042",
  status: "new",
  assigneeId: null,
  hazardClass: null,
  hazardClassReason: null,
  tenantUserId: 11,
  channel: "tenant-online",
  awareAt: "2026-01-15T09:00:00.000Z",
  createdAt: "2026-01-15T09:00:00.000Z",
  description: "Water on the bedroom window every morning",
  locations: ["window"],
  observations: ["condensation"],
  since: "weeks",
  area: null,
  vulnerability: [],
  equipment: { heatingUsable: "yes" },
  property: {
    id: 5,
    addressLine1: "1 Tanner Row",
    addressLine2: null,
    town: "Easterby",
    postcode: "ZX5 5AB",
    estate: "Millbeck Terraces",
  },
  rooms: [{ id: 2, name: "Bedroom 1", kind: "bedroom" }],
  homeRooms: myHome.property.rooms,
};

const photo = (id: number) => ({
  id,
  url: `/api/photos/${id}`,
  thumbnailUrl: `/api/photos/${id}/thumbnail`,
  width: 1600,
  height: 1200,
  sha256: "ab".repeat(32),
  workOrderId: null,
  createdAt: "2026-01-15T09:00:05.000Z",
});

/** The tenant's API: their home, and the case page's reads for case 42. */
function tenantApi(overrides: Record<string, MockReply | ((call: RecordedCall, nth: number) => MockReply)> = {}) {
  return mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/me/home": { body: myHome },
    "GET /api/me/cases": { body: { items: [] } },
    "POST /api/cases": { status: 201, body: created },
    "POST /api/cases/42/photos": { status: 201, body: { photos: [photo(7)], refused: [] } },
    "POST /api/cases/42/readings": { status: 201, body: { imported: 1, duplicates: 0, rejected: 0 } },
    "GET /api/cases/42": { body: created },
    "GET /api/cases/42/events": { body: { events: [] } },
    "GET /api/cases/42/photos": { body: { photos: [] } },
    "GET /api/cases/42/readings": { body: { readings: [] } },
    "GET /api/cases/42/evaluation": {
      body: { statement: "Your landlord will look into this report whatever the readings show.", rooms: [] },
    },
    ...overrides,
  });
}

async function openReport() {
  const view = renderApp("/report");
  expect(await screen.findByRole("heading", { level: 1, name: "Report damp or mould" })).toBeInTheDocument();
  await screen.findByRole("heading", { level: 2, name: /Step 1 of 6/ });
  return view;
}

const jpeg = (name = "window.jpg") => new File([new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3])], name, { type: "image/jpeg" });

describe("report form", () => {
  beforeEach(() => {
    clearCsrfToken();
    window.localStorage.clear();
  });

  it("checks each step with the shared schema: no place chosen, no going on", async () => {
    const { callsTo } = tenantApi();
    const user = userEvent.setup();
    await openReport();

    await user.type(screen.getByLabelText(/What can you see/), "Black spots in the corner");
    await user.click(screen.getByRole("button", { name: "Next" }));

    // The messages are caseReportSchema's own.
    const where = screen.getByRole("group", { name: "Where is it?" });
    expect(within(where).getByText("Choose at least one place.")).toBeInTheDocument();
    expect(where).toHaveAccessibleDescription(/Choose at least one place\./);
    expect(screen.getByText("Choose at least one thing you have noticed.")).toBeInTheDocument();
    expect(screen.getByRole("heading", { level: 2, name: /Step 1 of 6/ })).toBeInTheDocument();

    // Choosing fixes the message, and Next moves on with focus on the new step's heading.
    await user.click(screen.getByRole("checkbox", { name: "A corner of the room" }));
    expect(within(where).queryByText("Choose at least one place.")).not.toBeInTheDocument();
    await user.click(screen.getByRole("checkbox", { name: /Black, green or grey spots/ }));
    await user.click(screen.getByRole("button", { name: "Next" }));
    const step2 = await screen.findByRole("heading", { level: 2, name: /Step 2 of 6/ });
    expect(step2).toHaveFocus();
    expect(callsTo("POST", "/api/cases")).toHaveLength(0);
  });

  it("keeps a draft on this device and brings it back, kindly saying photos must be added again", async () => {
    tenantApi();
    const user = userEvent.setup();
    const first = await openReport();
    await user.type(screen.getByLabelText(/What can you see/), "Mould behind the wardrobe");
    await user.click(screen.getByRole("checkbox", { name: "Behind furniture or inside a wardrobe" }));

    await waitFor(() => {
      const saved = JSON.parse(window.localStorage.getItem(draftKey(users.tenant.id)) ?? "null");
      expect(saved?.values).toMatchObject({ description: "Mould behind the wardrobe", locations: ["behind-furniture"] });
    });
    first.unmount();

    // Someone else's draft on the same device is never offered.
    window.localStorage.setItem(draftKey(999), JSON.stringify({ version: 1, values: { description: "Not yours" } }));
    // A draft from an earlier visit, saved with two photos chosen, on the readings step.
    window.localStorage.setItem(
      draftKey(users.tenant.id),
      JSON.stringify({
        version: 1,
        savedAt: "2026-01-14T18:30:00.000Z",
        step: 1,
        values: {
          description: "Mould behind the wardrobe",
          locations: ["behind-furniture", "nonsense"],
          observations: ["musty-smell"],
          roomIds: [2, 99],
        },
        household: "none",
        readings: [{ roomId: 2, takenAt: "2026-01-14T18:00:00.000Z", airTemperatureC: 17.5, relativeHumidityPct: 71 }],
        photoCount: 2,
        hadLoggerFile: false,
      }),
    );
    renderApp("/report");
    expect(await screen.findByText("Welcome back: we kept your answers")).toBeInTheDocument();
    expect(screen.getByText(/please add your 2 photos again/)).toBeInTheDocument();
    expect(screen.getByRole("heading", { level: 2, name: /Step 2 of 6/ })).toBeInTheDocument();

    await user.click(screen.getByRole("button", { name: "Back" }));
    expect(screen.getByLabelText(/What can you see/)).toHaveValue("Mould behind the wardrobe");
    expect(screen.getByRole("checkbox", { name: "Behind furniture or inside a wardrobe" })).toBeChecked();
    expect(screen.getByRole("checkbox", { name: "A musty or damp smell" })).toBeChecked();
    expect(screen.getByRole("checkbox", { name: "Bedroom 1" })).toBeChecked();
    expect(screen.queryByText("Not yours")).not.toBeInTheDocument();
  });

  it("sends the case, then its photos, then its readings, and opens the case page", async () => {
    const { callsTo, calls, fetchMock } = tenantApi();
    const user = userEvent.setup();
    const { router } = await openReport();

    // 1 What and where
    await user.type(screen.getByLabelText(/What can you see/), "Water on the bedroom window every morning");
    await user.click(screen.getByRole("checkbox", { name: "Window or window frame" }));
    await user.click(screen.getByRole("checkbox", { name: "Water on the glass or sills" }));
    await user.click(screen.getByRole("checkbox", { name: "Bedroom 1" }));
    await user.click(screen.getByRole("button", { name: "Next" }));
    // 2 How long and how big
    await screen.findByRole("heading", { level: 2, name: /Step 2 of 6/ });
    await user.click(screen.getByRole("radio", { name: "A few weeks" }));
    await user.click(screen.getByRole("button", { name: "Next" }));
    // 3 About the home (neutral questions, each skippable) and the household
    await screen.findByRole("heading", { level: 2, name: /Step 3 of 6/ });
    const heating = screen.getByRole("group", { name: "Can the heating be used in this room?" });
    await user.click(within(heating).getByRole("radio", { name: "Yes" }));
    expect(screen.getByRole("group", { name: "Is there an extractor fan, and does it work?" })).toBeInTheDocument();
    expect(
      screen.getByRole("group", { name: "Are there trickle vents on the windows, and can they be opened?" }),
    ).toBeInTheDocument();
    expect(screen.getByText(/We ask so your landlord can prioritise/)).toBeInTheDocument();
    const household = screen.getByRole("group", { name: /Does anyone living in your home/ });
    await user.click(within(household).getByRole("checkbox", { name: "Children under 15" }));
    await user.click(within(household).getByRole("checkbox", { name: "None of these" }));
    expect(within(household).getByRole("checkbox", { name: "Children under 15" })).not.toBeChecked();
    await user.click(screen.getByRole("button", { name: "Next" }));
    // 4 Photos: a HEIC file is turned away in the browser with advice, a JPEG is kept
    await screen.findByRole("heading", { level: 2, name: /Step 4 of 6/ });
    const input = screen.getByLabelText("Add photos");
    await userEvent
      .setup({ applyAccept: false })
      .upload(input, [jpeg(), new File(["x"], "IMG_0001.HEIC", { type: "image/heic" })]);
    expect(await screen.findByText(/This photo is in HEIC format/)).toBeInTheDocument();
    expect(within(screen.getByRole("list", { name: "Photos you have chosen" })).getAllByRole("listitem")).toHaveLength(1);
    await user.click(screen.getByRole("button", { name: "Next" }));
    // 5 Readings by hand, with the engine's answer while typing
    await screen.findByRole("heading", { level: 2, name: /Step 5 of 6/ });
    await user.selectOptions(screen.getByLabelText("Room"), "Bedroom 1");
    await user.type(screen.getByLabelText("Air temperature (°C)"), "20");
    await user.type(screen.getByLabelText("Relative humidity (%)"), "70");
    await user.type(screen.getByLabelText(/^Surface temperature \(°C\)/), "12");
    const preview = screen.getByRole("region", { name: "What this reading shows" });
    expect(within(preview).getByText("Condensing")).toBeInTheDocument();
    expect(within(preview).getByText(/Whatever these numbers say/)).toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: "Add this reading" }));
    expect(await screen.findByText("Readings you've added (1)")).toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: "Next" }));
    // 6 Check and send
    await screen.findByRole("heading", { level: 2, name: /Step 6 of 6/ });
    expect(screen.getByText("1 photo")).toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: "Send report" }));

    expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe("/cases/42");
    expect(screen.getByText("Thank you. Your report has been sent")).toBeInTheDocument();

    const writes = calls.filter((c) => c.method === "POST").map((c) => c.path);
    expect(writes).toEqual(["/api/cases", "/api/cases/42/photos", "/api/cases/42/readings"]);
    const [post] = callsTo("POST", "/api/cases");
    expect(post!.body).toEqual({
      description: "Water on the bedroom window every morning",
      locations: ["window"],
      observations: ["condensation"],
      roomIds: [2],
      since: "weeks",
      vulnerability: [],
      equipment: { heatingUsable: "yes" },
    });
    expect(post!.headers.get("X-CSRF-Token")).toBe("csrf-1");

    const upload = fetchMock.mock.calls.find(([url]) => String(url) === "/api/cases/42/photos")!;
    const body = upload[1]!.body as FormData;
    expect(body).toBeInstanceOf(FormData);
    expect((body.getAll("photos") as File[]).map((f) => f.name)).toEqual(["window.jpg"]);
    // The browser sets the multipart boundary; the client must not force JSON.
    expect(new Headers(upload[1]!.headers).get("Content-Type")).toBeNull();
    expect(new Headers(upload[1]!.headers).get("X-CSRF-Token")).toBe("csrf-1");

    const [readings] = callsTo("POST", "/api/cases/42/readings");
    expect(readings!.body).toEqual([
      { roomId: 2, takenAt: expect.stringMatching(/Z$/), airTemperatureC: 20, relativeHumidityPct: 70, surfaceTemperatureC: 12 },
    ]);
    expect(window.localStorage.getItem(draftKey(users.tenant.id))).toBeNull();
  });

  it("keeps the report when photos fail afterwards, and offers a retry on the case page", async () => {
    const heic = "This photo is in HEIC format, which we cannot read yet.";
    const { callsTo } = tenantApi({
      "POST /api/cases/42/photos": (_call, nth) =>
        nth === 0 ? apiError(415, "unsupported_media_type", heic) : { status: 201, body: { photos: [photo(8)], refused: [] } },
    });
    const user = userEvent.setup();
    await openReport();

    await user.type(screen.getByLabelText(/What can you see/), "Condensation on the window");
    await user.click(screen.getByRole("checkbox", { name: "Window or window frame" }));
    await user.click(screen.getByRole("checkbox", { name: "Water on the glass or sills" }));
    for (const n of [2, 3, 4]) {
      await user.click(screen.getByRole("button", { name: "Next" }));
      await screen.findByRole("heading", { level: 2, name: new RegExp(`Step ${n} of 6`) });
    }
    await user.upload(screen.getByLabelText("Add photos"), jpeg("sill.jpg"));
    await user.click(screen.getByRole("button", { name: "Next" }));
    await user.click(await screen.findByRole("button", { name: "Next" }));
    await user.click(await screen.findByRole("button", { name: "Send report" }));

    expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
    expect(screen.getByText("Your report is sent, but the photos didn't upload")).toBeInTheDocument();
    expect(screen.getByText(heic)).toBeInTheDocument();
    expect(screen.getByText(/One part still needs your help/)).toBeInTheDocument();

    await user.click(screen.getByRole("button", { name: "Try the photos again" }));
    await waitFor(() => expect(screen.queryByText("Your report is sent, but the photos didn't upload")).not.toBeInTheDocument());
    expect(callsTo("POST", "/api/cases")).toHaveLength(1);
    expect(callsTo("POST", "/api/cases/42/photos")).toHaveLength(2);
  });

  it("says so and keeps every answer when the case itself could not be sent", async () => {
    tenantApi({
      "POST /api/cases": { status: 503, body: { error: { code: "unavailable", message: "Dewline is busy. Please try again." } } },
    });
    const user = userEvent.setup();
    const { router } = await openReport();
    await user.type(screen.getByLabelText(/What can you see/), "Wet patch on the ceiling");
    await user.click(screen.getByRole("checkbox", { name: "Ceiling" }));
    await user.click(screen.getByRole("checkbox", { name: "Damp or wet patches on walls or ceilings" }));
    for (let n = 2; n <= 6; n++) {
      await user.click(screen.getByRole("button", { name: "Next" }));
      await screen.findByRole("heading", { level: 2, name: new RegExp(`Step ${n} of 6`) });
    }
    await user.click(screen.getByRole("button", { name: "Send report" }));
    expect(await screen.findByText("Your report has not been sent yet")).toBeInTheDocument();
    expect(screen.getByText("Dewline is busy. Please try again.")).toBeInTheDocument();
    expect(router.state.location.pathname).toBe("/report");
    await waitFor(() => expect(window.localStorage.getItem(draftKey(users.tenant.id))).toContain("Wet patch on the ceiling"));
  });
});
