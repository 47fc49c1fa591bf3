import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, makeProperty, mockApi, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const homeRooms = [
  { id: 1, name: "Living room", kind: "living" },
  { id: 2, name: "Bedroom 1", kind: "bedroom" },
];

const theCase = {
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
  description: "Condensation on the bedroom window",
  locations: ["window"],
  observations: ["condensation"],
  since: null,
  area: null,
  vulnerability: null,
  equipment: null,
  property: {
    id: 5,
    addressLine1: "1 Tanner Row",
    addressLine2: null,
    town: "Easterby",
    postcode: "ZX3 1AA",
    estate: "Millbeck Terraces",
  },
  rooms: [],
  homeRooms,
};

const csv = ["Time;Temp;RH;Probe", "15/01/2026 07:00;19,2;71;12,4", "15/01/2026 07:10;19,1;72;12,3"].join("\n");
const loggerFile = () => new File([csv], "bedroom-logger.csv", { type: "text/csv" });

/** What the server proposes (columns by position): it took the probe for the humidity, which the person corrects. */
const preview = {
  delimiter: ";",
  decimalComma: true,
  hasHeader: true,
  headers: ["Time", "Temp", "RH", "Probe"],
  mapping: {
    timestamp: 0,
    temperature: 1,
    humidity: 3,
    temperatureUnit: "C",
    dateFormat: "DD/MM/YYYY",
    timeZone: "Europe/London",
  },
  sampleRows: [
    ["15/01/2026 07:00", "19,2", "71", "12,4"],
    ["15/01/2026 07:10", "19,1", "72", "12,3"],
  ],
  problems: ["Day and month could be either way round in these dates; we read them day first."],
};

const importResult = {
  importId: 3,
  imported: 1000,
  duplicates: 4,
  rejected: 3,
  rejectedReportUrl: "/api/cases/42/readings/imports/3/rejected.csv",
};

function caseApi(overrides: Record<string, MockReply | ((call: RecordedCall, nth: number) => MockReply)> = {}) {
  return mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/me/home": {
      body: { tenancy: { id: 4, startDate: "2021-04-12", endDate: null }, property: { ...makeProperty(5), rooms: homeRooms } },
    },
    "GET /api/me/cases": { body: { items: [] } },
    "POST /api/cases": { status: 201, body: theCase },
    "GET /api/cases/42": { body: theCase },
    "GET /api/cases/42/events": { body: { events: [] } },
    "GET /api/cases/42/photos": { body: { photos: [] } },
    "GET /api/cases/42/readings": { body: { readings: [] } },
    "GET /api/cases/42/evaluation": {
      body: { statement: "Your landlord will look into this report whatever the readings show.", rooms: [] },
    },
    "POST /api/cases/42/readings/import/preview": { body: preview },
    "POST /api/cases/42/readings/import": { status: 201, body: importResult },
    ...overrides,
  });
}

const formDataOf = (fetchMock: ReturnType<typeof caseApi>["fetchMock"], path: string, nth = 0) => {
  const call = fetchMock.mock.calls.filter(([url]) => String(url) === path)[nth];
  return call?.[1]?.body as FormData | undefined;
};

describe("logger CSV import", () => {
  beforeEach(() => {
    clearCsrfToken();
    window.localStorage.clear();
  });

  it("shows the proposed columns, lets the person change one, and imports with their mapping", async () => {
    const { fetchMock, callsTo } = caseApi();
    const user = userEvent.setup();
    renderApp("/cases/42");
    await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" });

    await user.click(screen.getByRole("button", { name: "Add readings" }));
    const panel = screen.getByRole("region", { name: "Add more readings" });
    expect(within(panel).getByRole("heading", { level: 2, name: "Add more readings" })).toHaveFocus();

    await user.click(within(panel).getByRole("button", { name: "Check the file" }));
    expect(within(panel).getByText("Choose the logger file.")).toBeInTheDocument();
    await user.upload(within(panel).getByLabelText("Logger file (CSV)"), loggerFile());
    await user.selectOptions(within(panel).getByLabelText("Where was the logger?"), "Bedroom 1");
    await user.click(within(panel).getByRole("button", { name: "Check the file" }));

    expect(await within(panel).findByRole("heading", { name: "Check the columns of bedroom-logger.csv" })).toHaveFocus();
    expect(formDataOf(fetchMock, "/api/cases/42/readings/import/preview")?.get("file")).toBeInstanceOf(File);
    const sample = within(panel).getByRole("table", { name: "The first rows of your file" });
    expect(
      within(sample)
        .getAllByRole("columnheader")
        .map((th) => th.textContent),
    ).toEqual(["Time", "Temp", "RH", "Probe"]);
    expect(within(panel).getByText(preview.problems[0]!)).toBeInTheDocument();

    const humidity = within(panel).getByLabelText("Humidity column");
    expect(humidity).toHaveDisplayValue(/^Probe/);
    await user.selectOptions(humidity, within(humidity).getByRole("option", { name: /^RH/ }));
    const surface = within(panel).getByLabelText(/^Surface temperature column/);
    await user.selectOptions(surface, within(surface).getByRole("option", { name: /^Probe/ }));
    expect(within(panel).getByLabelText("How dates are written")).toHaveDisplayValue(/Day first, for example 15\/01\/2026/);
    await user.click(within(panel).getByRole("radio", { name: "Degrees Fahrenheit (°F)" }));
    await user.click(within(panel).getByRole("radio", { name: "Degrees Celsius (°C)" }));

    await user.click(within(panel).getByRole("button", { name: "Import readings" }));
    expect(await within(panel).findByText("1,000 readings added")).toBeInTheDocument();
    expect(within(panel).getByText(/4 readings were already in your report/)).toBeInTheDocument();
    expect(within(panel).getByRole("link", { name: "Download the rows we couldn't read (CSV)" })).toHaveAttribute(
      "href",
      importResult.rejectedReportUrl,
    );

    const sent = formDataOf(fetchMock, "/api/cases/42/readings/import")!;
    expect(sent.get("roomId")).toBe("2");
    expect((sent.get("file") as File).name).toBe("bedroom-logger.csv");
    // By position, as the server proposed them and as its import accepts them.
    expect(JSON.parse(String(sent.get("mapping")))).toEqual({
      timestamp: 0,
      temperature: 1,
      humidity: 2,
      surfaceTemperature: 3,
      temperatureUnit: "C",
      dateFormat: "DD/MM/YYYY",
      timeZone: "Europe/London",
    });
    // What the readings show is worked out again.
    await waitFor(() => expect(callsTo("GET", "/api/cases/42/evaluation").length).toBeGreaterThanOrEqual(2));
  });

  it("will not import two roles from one column", async () => {
    const { callsTo } = caseApi();
    const user = userEvent.setup();
    renderApp("/cases/42");
    await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" });
    await user.click(screen.getByRole("button", { name: "Add readings" }));
    const panel = screen.getByRole("region", { name: "Add more readings" });
    await user.upload(within(panel).getByLabelText("Logger file (CSV)"), loggerFile());
    await user.selectOptions(within(panel).getByLabelText("Where was the logger?"), "Living room");
    await user.click(within(panel).getByRole("button", { name: "Check the file" }));
    await within(panel).findByRole("table", { name: "The first rows of your file" });

    const humidity = within(panel).getByLabelText("Humidity column");
    await user.selectOptions(humidity, within(humidity).getByRole("option", { name: /^Temp/ }));
    await user.click(within(panel).getByRole("button", { name: "Import readings" }));
    expect(within(panel).getByText(/This is the same column as the air temperature column/)).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/42/readings/import")).toHaveLength(0);
  });

  it("shows the server's message when it can't read the file", async () => {
    const message = "We couldn't find a date, a temperature or a humidity column in this file.";
    caseApi({ "POST /api/cases/42/readings/import/preview": apiError(422, "unprocessable", message) });
    const user = userEvent.setup();
    renderApp("/cases/42");
    await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" });
    await user.click(screen.getByRole("button", { name: "Add readings" }));
    const panel = screen.getByRole("region", { name: "Add more readings" });
    await user.upload(within(panel).getByLabelText("Logger file (CSV)"), loggerFile());
    await user.selectOptions(within(panel).getByLabelText("Where was the logger?"), "Bedroom 1");
    await user.click(within(panel).getByRole("button", { name: "Check the file" }));
    expect(await within(panel).findByText(message)).toBeInTheDocument();
  });

  it("checks a logger file chosen in the report form on the case page, once the report is sent", async () => {
    const { fetchMock } = caseApi();
    const user = userEvent.setup();
    renderApp("/report");
    await screen.findByRole("heading", { level: 2, name: /Step 1 of 6/ });
    await user.type(screen.getByLabelText(/What can you see/), "Condensation on the bedroom window");
    await user.click(screen.getByRole("checkbox", { name: "Window or window frame" }));
    await user.click(screen.getByRole("checkbox", { name: "Water on the glass or sills" }));
    for (const n of [2, 3, 4, 5]) {
      await user.click(screen.getByRole("button", { name: "Next" }));
      await screen.findByRole("heading", { level: 2, name: new RegExp(`Step ${n} of 6`) });
    }
    await user.upload(screen.getByLabelText("Logger file (CSV)"), loggerFile());
    await user.click(screen.getByRole("button", { name: "Next" }));
    expect(await screen.findByText("Choose where the logger was, or remove the file.")).toBeInTheDocument();
    await user.selectOptions(screen.getByLabelText("Where was the logger?"), "Bedroom 1");
    await user.click(screen.getByRole("button", { name: "Next" }));
    await screen.findByRole("heading", { level: 2, name: /Step 6 of 6/ });
    // The check-and-send card for readings names the logger file under its own question.
    const readingsCard = screen.getByRole("region", { name: "Readings" });
    expect(within(readingsCard).getByText("Logger file")).toBeInTheDocument();
    expect(within(readingsCard).getByText("bedroom-logger.csv")).toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: "Send report" }));

    expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
    const check = screen.getByRole("region", { name: "Check your logger file" });
    expect(await within(check).findByRole("table", { name: "The first rows of your file" })).toBeInTheDocument();
    expect((formDataOf(fetchMock, "/api/cases/42/readings/import/preview")?.get("file") as File).name).toBe("bedroom-logger.csv");
    const humidity = within(check).getByLabelText("Humidity column");
    await user.selectOptions(humidity, within(humidity).getByRole("option", { name: /^RH/ }));
    await user.click(within(check).getByRole("button", { name: "Import readings" }));
    expect(await within(check).findByText("1,000 readings added")).toBeInTheDocument();
    expect(formDataOf(fetchMock, "/api/cases/42/readings/import")?.get("roomId")).toBe("2");
  });
});
