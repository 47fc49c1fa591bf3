import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { homesAtRiskResponse } from "@/lib/contracts";
import { mockApi, mockReply, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const days = (hours: number[]) => hours.map((h, i) => ({ date: `2026-11-0${i + 1}`, hoursAt80: h, hoursCondensing: 0 }));
const room = (roomId: number, roomName: string, over: Record<string, unknown> = {}) => ({
  roomId,
  roomName,
  surfaceBasis: "measured" as const,
  hoursAt80: 96,
  hoursCondensing: 0,
  condensingDays: 0,
  mouldIndex: 0.4,
  days: days([0, 24, 24, 24, 24, 0, 0]),
  latestReadingAt: "2026-11-06T00:00:00Z",
  latestAirTemperatureC: 20,
  latestRelativeHumidityPct: 90,
  latestSurfaceRelativeHumidityPct: 90,
  computedAt: "2026-11-06T00:01:00Z",
  ...over,
});

const LIST = mockReply(homesAtRiskResponse, {
  items: [
    {
      propertyId: 7,
      address: "12 Wren Close, Testford ZX1 1AA",
      estate: "Wren Estate",
      alertId: 41,
      firstRaisedAt: "2026-11-05T00:00:00Z",
      alerts: [
        {
          id: 41,
          roomId: 70,
          rule: "hours-at-80",
          raisedAt: "2026-11-05T00:00:00Z",
          figures: { hoursAt80: 72, hoursCondensing: 0, condensingDays: 0, mouldIndex: 0.4 },
        },
      ],
      rooms: [room(70, "Bedroom")],
    },
    {
      propertyId: 8,
      address: "3 Heron Way, Testford ZX1 1AB",
      estate: "Wren Estate",
      alertId: 52,
      firstRaisedAt: "2026-11-04T04:00:00Z",
      alerts: [
        {
          id: 52,
          roomId: 80,
          rule: "condensing-days",
          raisedAt: "2026-11-04T04:00:00Z",
          figures: { hoursAt80: 4, hoursCondensing: 3, condensingDays: 3, mouldIndex: 0 },
        },
      ],
      rooms: [room(80, "Kitchen", { surfaceBasis: "air", condensingDays: 3, hoursAt80: 4, mouldIndex: 0 })],
    },
  ],
});

function setup(role: keyof typeof users = "officer", url = "/alerts") {
  const api = mockApi({
    "GET /api/auth/me": { body: users[role] },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/sensor-alerts": { body: LIST },
    "POST /api/sensor-alerts/41/proactive-case": {
      status: 201,
      body: { caseId: 900, reference: "DW-2026-00900", created: true },
    },
    "POST /api/sensor-alerts/52/dismiss": { body: { dismissed: 1 } },
  });
  return { ...api, ...renderApp(url) };
}

describe("the Alerts view", () => {
  beforeEach(() => clearCsrfToken());

  it("lists the homes at risk with their figures, in words, and a chart per room", async () => {
    setup();
    expect(await screen.findByRole("heading", { level: 1, name: "Alerts" })).toBeInTheDocument();
    const wren = screen.getByRole("rowheader", { name: /12 Wren Close/ }).closest("tr")!;
    expect(within(wren).getByText("Damp surface for long hours")).toBeInTheDocument();
    expect(within(wren).getByText("96 h")).toBeInTheDocument();
    expect(
      within(wren).getByRole("img", { name: /Bedroom: hours at 80 % surface humidity or more per day/ }),
    ).toBeInTheDocument();
    const heron = screen.getByRole("rowheader", { name: /3 Heron Way/ }).closest("tr")!;
    expect(within(heron).getByText("Condensation on several days")).toBeInTheDocument();
    expect(within(heron).getByText(/condensing on 3 of 7 days/)).toBeInTheDocument();
    // Said plainly when no surface figure is known.
    expect(within(heron).getByText(/no surface figure: air humidity only/)).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Alerts" })).toBeInTheDocument();
  });

  it("sorts on the server by the column chosen, kept in the address", async () => {
    const { callsTo, router } = setup();
    await screen.findByRole("heading", { level: 1, name: "Alerts" });
    await userEvent.click(await screen.findByRole("button", { name: "Mould index" }));
    await waitFor(() =>
      expect(callsTo("GET", "/api/sensor-alerts").some((c) => c.search.get("sort") === "mouldIndex")).toBe(true),
    );
    expect(router.state.location.search).toContain("sort=mouldIndex");
    expect(screen.getByRole("columnheader", { name: "Mould index" })).toHaveAttribute("aria-sort", "descending");
  });

  it("opens a proactive case with one click and goes to it", async () => {
    const { callsTo, router } = setup();
    const wren = (await screen.findByRole("rowheader", { name: /12 Wren Close/ })).closest("tr")!;
    await userEvent.click(within(wren).getByRole("button", { name: "Open a case" }));
    await waitFor(() => expect(router.state.location.pathname).toBe("/cases/900"));
    expect(callsTo("POST", "/api/sensor-alerts/41/proactive-case")).toHaveLength(1);
  });

  it("dismisses with the officer's reason", async () => {
    const { callsTo } = setup();
    const heron = (await screen.findByRole("rowheader", { name: /3 Heron Way/ })).closest("tr")!;
    await userEvent.click(within(heron).getByRole("button", { name: "Dismiss…" }));
    await userEvent.type(within(heron).getByRole("textbox", { name: "Why dismiss it?" }), "Sensor fitted above the kettle.");
    await userEvent.click(within(heron).getByRole("button", { name: "Dismiss" }));
    await waitFor(() => expect(callsTo("POST", "/api/sensor-alerts/52/dismiss")).toHaveLength(1));
    expect(callsTo("POST", "/api/sensor-alerts/52/dismiss")[0]!.body).toEqual({ reason: "Sensor fitted above the kettle." });
  });

  it("is not for the maintenance lead", async () => {
    setup("maintenance");
    expect(await screen.findByRole("heading", { level: 1 })).not.toHaveTextContent("Alerts");
    expect(screen.queryByRole("link", { name: "Alerts" })).toBeNull();
  });
});
