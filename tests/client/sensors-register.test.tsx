// The Sensors page for a maintenance lead: the register form checks its fields before sending, the
// new sensor's secret is shown once with its MQTT user and topic, and is gone once dismissed.
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { makeProperty, mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const home = {
  ...makeProperty(7),
  rooms: [
    { id: 71, name: "Bedroom", kind: "bedroom" },
    { id: 72, name: "Kitchen", kind: "kitchen" },
  ],
};
const SECRET = `dws_${"b".repeat(43)}`;
const sensor = {
  id: 5,
  propertyId: 7,
  roomId: 71,
  homeAddress: home.addressLine1,
  roomName: "Bedroom",
  serial: "TH-0042",
  model: "TH-2",
  placement: "external wall corner, 0.3 m above floor",
  measuresSurface: true,
  intervalS: 900,
  installedOn: "2026-11-30",
  removedOn: null,
  state: "active",
  mqttUsername: "s5",
  mqttTopic: "sensors/s5/readings",
  keyIssuedAt: "2026-11-30T10:00:00.000Z",
  revokedAt: null,
  lastReadingAt: null,
  version: 1,
} as const;

function setup() {
  const api = mockApi({
    "GET /api/auth/me": { body: users.maintenance },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/sensors": { body: { items: [], total: 0, page: 1, pageSize: 25 } },
    "GET /api/properties": { body: { items: [], total: 0, page: 1, pageSize: 20 } },
    "GET /api/properties/7": { body: home },
    "POST /api/sensors": {
      status: 201,
      body: {
        sensor,
        credentials: {
          secret: SECRET,
          mqttUsername: "s5",
          mqttTopic: "sensors/s5/readings",
          httpPath: "/api/sensor-ingest/readings",
        },
      },
    },
  });
  return { ...api, ...renderApp("/sensors?home=7") };
}

describe("registering a sensor", () => {
  beforeEach(() => clearCsrfToken());

  it("checks the form, sends it, and shows the secret once with the MQTT user and topic", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    // The home in the address filters the list and is the home the form registers in.
    expect(await screen.findByText("No sensors match")).toBeInTheDocument();
    // The form starts afresh once the home (and its rooms) has loaded.
    await screen.findByRole("option", { name: "Bedroom" });
    const form = screen.getByRole("form", { name: "Register a sensor" });
    expect(within(form).getByRole("combobox", { name: /Reporting interval/ })).toHaveValue("900");

    await user.click(within(form).getByRole("button", { name: "Register sensor" }));
    expect(await within(form).findByText("Give the serial number.")).toBeInTheDocument();
    expect(within(form).getByText("Choose the room.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/sensors")).toHaveLength(0);

    await user.selectOptions(within(form).getByRole("combobox", { name: /Room/ }), "Bedroom");
    await user.type(within(form).getByRole("textbox", { name: /Serial number/ }), "TH-0042");
    await user.type(within(form).getByRole("textbox", { name: /Model/ }), "TH-2");
    await user.type(within(form).getByRole("textbox", { name: /Placement/ }), "external wall corner, 0.3 m above floor");
    await user.click(within(form).getByRole("checkbox", { name: /surface temperature probe/ }));
    await user.click(within(form).getByRole("button", { name: "Register sensor" }));

    expect(await screen.findByRole("textbox", { name: "Device secret" })).toHaveValue(SECRET);
    expect(screen.getByText("sensors/s5/readings")).toBeInTheDocument();
    expect(screen.getByText("s5")).toBeInTheDocument();
    // How to send a backlog: the CSV header the ingest reads.
    expect(screen.getByText("takenAt,airTemperatureC,relativeHumidityPct,surfaceTemperatureC,batteryPct")).toBeInTheDocument();
    const sent = callsTo("POST", "/api/sensors")[0]!.body as Record<string, unknown>;
    expect(sent).toMatchObject({
      propertyId: 7,
      roomId: 71,
      serial: "TH-0042",
      model: "TH-2",
      placement: "external wall corner, 0.3 m above floor",
      measuresSurface: true,
      intervalS: 900,
    });
    expect(sent.installedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);

    await user.click(screen.getByRole("button", { name: "I have stored it" }));
    expect(screen.queryByDisplayValue(SECRET)).toBeNull();
    expect(screen.queryByText(SECRET)).toBeNull();
  });
});
