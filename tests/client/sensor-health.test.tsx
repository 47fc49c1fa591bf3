// The maintenance lead's sensor health page: the summary counts, the sensors needing attention with
// their home, room, serial, state, since and reason, the problem filter kept in the URL, and the empty
// and loading states. Replies are parsed with the API contract by the mock.
import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { mockApi, users, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const summary = {
  total: 12,
  ok: 10,
  needingAttention: 2,
  counts: { offline: 1, "low-battery": 1, "flat-lined": 0, jumping: 0 },
  oldestCheckAt: "2026-11-20T11:59:00.000Z",
  at: "2026-11-20T12:00:00.000Z",
} as const;

const home = { id: 7, addressLine1: "14 Alder Row", town: "Brinkmoor", postcode: "BM2 4QT" };
const offline = {
  sensor: { id: 31, serial: "TH-00431", placement: "external wall corner, 0.3 m above floor", intervalS: 900 },
  home,
  room: { id: 70, name: "Back bedroom" },
  lastReadingAt: "2026-11-20T10:00:00.000Z",
  findings: [
    {
      problem: "offline",
      since: "2026-11-20T10:00:00.000Z",
      reason: "No reading for 2 h (it reports every 15 min, so it counts as offline after 30 min).",
    },
  ],
  checkedAt: "2026-11-20T10:01:00.000Z",
} as const;
const lowBattery = {
  sensor: { id: 32, serial: "TH-00432", placement: "above the kitchen window", intervalS: 900 },
  home,
  room: { id: 71, name: "Kitchen" },
  lastReadingAt: "2026-11-20T11:55:00.000Z",
  findings: [
    {
      problem: "low-battery",
      since: "2026-11-19T08:00:00.000Z",
      reason: "Battery at 17 % (ours: 20 % or less is low; change it soon).",
    },
  ],
  checkedAt: "2026-11-20T11:56:00.000Z",
} as const;

function setup(url = "/sensors/health", items: readonly object[] = [offline, lowBattery], held?: Promise<void>) {
  const api = mockApi({
    "GET /api/auth/me": { body: users.maintenance },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/sensor-health/summary": {
      body: items.length
        ? summary
        : { ...summary, ok: 12, needingAttention: 0, counts: { offline: 0, "low-battery": 0, "flat-lined": 0, jumping: 0 } },
    },
    "GET /api/sensor-health/devices": (call: RecordedCall) => {
      const problem = call.search.get("problem");
      const shown = items.filter((i) => !problem || (i as typeof offline).findings.some((f) => f.problem === problem));
      return { body: { items: shown, total: shown.length, page: 1, pageSize: 50 } };
    },
  });
  // Sensor health's replies can be held back, to see the page while they are on their way.
  if (held)
    vi.stubGlobal("fetch", async (input: RequestInfo | URL, init?: RequestInit) => {
      if (String(input).includes("/sensor-health/")) await held;
      return api.fetchMock(input, init);
    });
  return { ...api, ...renderApp(url) };
}

describe("sensor health", () => {
  beforeEach(() => clearCsrfToken());

  it("shows the summary and each sensor needing attention with its home, room, state, since and reason", async () => {
    setup();
    const panel = await screen.findByRole("region", { name: "Sensor health" });
    expect(await within(panel).findByText(/12 sensors in use: 10 working,/)).toBeInTheDocument();
    expect(within(panel).getByRole("link", { name: "Offline: 1 sensor, show them" })).toHaveAttribute(
      "href",
      "/sensors/health?problem=offline",
    );

    const table = await screen.findByRole("table", { name: "Sensors needing attention" });
    const row = (await within(table).findByText("TH-00431")).closest("tr")!;
    expect(within(row).getByText("14 Alder Row")).toBeInTheDocument();
    expect(within(row).getByText("Back bedroom")).toBeInTheDocument();
    expect(within(row).getAllByText("Offline").length).toBeGreaterThan(0);
    expect(
      within(row).getByText("No reading for 2 h (it reports every 15 min, so it counts as offline after 30 min)."),
    ).toBeInTheDocument();
    expect(within(table).getByText("Battery at 17 % (ours: 20 % or less is low; change it soon).")).toBeInTheDocument();
  });

  it("filters by problem, asking the server for those sensors only", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    const table = await screen.findByRole("table", { name: "Sensors needing attention" });
    await within(table).findByText("TH-00432");
    const select = screen.getByRole("combobox", { name: "Show" });
    select.focus();
    await user.selectOptions(select, "offline");
    await waitFor(() => expect(within(table).queryByText("TH-00432")).toBeNull());
    expect(within(table).getByText("TH-00431")).toBeInTheDocument();
    expect(callsTo("GET", "/api/sensor-health/devices").at(-1)!.search.get("problem")).toBe("offline");
  });

  it("says so when every sensor is working", async () => {
    setup("/sensors/health", []);
    expect(await screen.findByText("Every sensor is working")).toBeInTheDocument();
  });

  it("says it is loading before the figures arrive", async () => {
    let release = () => {};
    setup("/sensors/health", [offline], new Promise<void>((resolve) => (release = resolve)));
    expect(await screen.findByText("Counting the sensors…")).toBeInTheDocument();
    release();
    expect(await screen.findByText(/12 sensors in use/)).toBeInTheDocument();
  });
});
