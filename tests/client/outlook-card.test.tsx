// The condensation outlook card on the tenant's home page: levels said in words (the shape and colour
// only repeat them), the tips and the usual cautions, and a plain note when there is no forecast.
import { screen, within } from "@testing-library/react";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import type { OutlookResponse } from "@/lib/contracts";
import { OUTLOOK_CAUTIONS } from "@/lib/domain/condensation-outlook";
import { makeProperty, mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const rooms = [
  { id: 51, name: "Bedroom", kind: "bedroom" },
  { id: 52, name: "Kitchen", kind: "kitchen" },
];
const myHome = { tenancy: { id: 4, startDate: "2021-04-12", endDate: null }, property: { ...makeProperty(5), rooms } };
const dates = ["2026-12-07", "2026-12-08", "2026-12-09"];

function day(date: string, level: "unlikely" | "possible" | "likely" | null, at80 = 0, condensing = 0) {
  return {
    date,
    hours: level === null ? 0 : 24,
    hoursAtOrAbove80: at80,
    condensingHours: condensing,
    coldestSurfaceTemperatureC: level === null ? null : 9,
    highestSurfaceRelativeHumidityPct: level === null ? null : 90,
    lowestOutdoorTemperatureC: level === null ? null : 2,
    level,
  };
}

const outlook: OutlookResponse = {
  propertyId: 5,
  generatedAt: "2026-12-07T09:20:00.000Z",
  timeZone: "Europe/London",
  dates,
  forecastAvailable: true,
  surface: {
    elementId: "corner-thermal-bridge",
    label: "External corner of a solid wall (thermal bridge)",
    fRsi: 0.4,
    basis: "ours",
  },
  rooms: [
    {
      roomId: 51,
      name: "Bedroom",
      kind: "bedroom",
      indoor: { airTemperatureC: 18, relativeHumidityPct: 60, source: "assumed", takenAt: null },
      days: [day(dates[0]!, "unlikely"), day(dates[1]!, "possible", 5), day(dates[2]!, "likely", 7, 3)],
      hours: [],
    },
    {
      roomId: 52,
      name: "Kitchen",
      kind: "kitchen",
      indoor: { airTemperatureC: 20.4, relativeHumidityPct: 66, source: "sensor", takenAt: "2026-12-07T09:00:00.000Z" },
      days: [day(dates[0]!, "unlikely"), day(dates[1]!, "unlikely"), day(dates[2]!, null)],
      hours: [],
    },
  ],
  tips: [
    { id: "trickle-vents", text: "Keep the trickle vents at the top of your windows open.", basis: "common practice, no source" },
    {
      id: "steady-heating",
      text: "Cold weather is forecast: keep the heating on steady and low.",
      basis: "common practice, no source",
    },
  ],
  cautions: OUTLOOK_CAUTIONS.map((c) => ({ ...c })),
  method: ["Surface temperature = outdoor + fRsi × (indoor − outdoor) (ISO 13788)."],
};

function render(reply: OutlookResponse) {
  mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/me/home": { body: myHome },
    "GET /api/me/cases": { body: { items: [] } },
    "GET /api/me/outlook": { body: reply },
  });
  renderApp("/home");
}

describe("the condensation outlook card", () => {
  beforeEach(() => clearCsrfToken());

  it("says each room's level per day in words, not by colour alone", async () => {
    render(outlook);
    const card = await screen.findByRole("region", { name: /Condensation outlook/ });
    const table = await within(card).findByRole("table", { name: "Chance of condensation by room and day" });
    expect(within(table).getByRole("columnheader", { name: /Today.*Monday 7 December/ })).toBeInTheDocument();
    expect(within(table).getByRole("columnheader", { name: /Tomorrow/ })).toBeInTheDocument();
    expect(within(table).getByRole("columnheader", { name: /Wednesday/ })).toBeInTheDocument();

    const bedroom = within(table).getByRole("row", { name: /Bedroom/ });
    const cells = within(bedroom).getAllByRole("cell");
    expect(cells.map((c) => c.textContent)).toEqual([
      "○Unlikely",
      "◐Possibleabout 5 h of very humid surface",
      "●Likelyabout 3 h of condensation",
    ]);
    // The shape is decoration for sighted readers; the words carry the level for everyone.
    for (const cell of cells) expect(within(cell).getByText(/[○◐●]/)).toHaveAttribute("aria-hidden", "true");
    const kitchen = within(table).getByRole("row", { name: /Kitchen/ });
    expect(within(kitchen).getAllByRole("cell")[2]).toHaveTextContent("No forecast");

    // Where each room's indoor figures came from.
    expect(within(card).getByText(/we have no recent readings, so we assumed 18\.0 °C and 60 % humidity/)).toBeInTheDocument();
    expect(within(card).getByText(/from the sensor in the room \(20\.4 °C and 66 % humidity\)/)).toBeInTheDocument();
  });

  it("shows the tips with their basis and every caution", async () => {
    render(outlook);
    const tips = await screen.findByRole("region", { name: "What helps" });
    expect(within(tips).getByText(/trickle vents/)).toBeInTheDocument();
    expect(within(tips).getAllByText(/Basis: common practice, no source/)).toHaveLength(2);
    const cautions = screen.getByRole("region", { name: "Please keep in mind" });
    expect(within(cautions).getByText(/Never use a gas oven or hob/)).toBeInTheDocument();
    expect(within(cautions).getByText(/Do not block air bricks/)).toBeInTheDocument();
    expect(within(cautions).getByText(/report it to your landlord, whatever this outlook says/)).toBeInTheDocument();
    expect(within(cautions).getByText(/breathing problems/)).toBeInTheDocument();
    expect(within(cautions).getAllByRole("listitem")).toHaveLength(OUTLOOK_CAUTIONS.length);
  });

  it("says so when the home has no forecast, and still gives the tips and cautions", async () => {
    render({
      ...outlook,
      forecastAvailable: false,
      rooms: outlook.rooms.map((r) => ({ ...r, days: dates.map((d) => day(d, null)) })),
    });
    const card = await screen.findByRole("region", { name: /Condensation outlook/ });
    expect(await within(card).findByText("No forecast for your home yet")).toBeInTheDocument();
    expect(within(card).getByText(/location is not on our records yet/)).toBeInTheDocument();
    expect(within(card).queryByRole("table")).not.toBeInTheDocument();
    expect(within(card).getByRole("region", { name: "Please keep in mind" })).toBeInTheDocument();
  });
});
