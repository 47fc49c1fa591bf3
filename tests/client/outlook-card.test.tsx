// The condensation outlook card on the tenant's home page: levels said in words (the shape and colour
// only repeat them), the tips and the usual cautions, and a plain note when there is no forecast.
import { screen, within } from "@testing-library/react";
import { IntlMessageFormat } from "intl-messageformat";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import type { OutlookResponse } from "@/lib/contracts";
import { OUTLOOK_CAUTIONS, OUTLOOK_METHOD, outlookTips } from "@/lib/domain/condensation-outlook";
import { getBuildingElement } from "@/lib/domain/surface";
import { i18n, showLanguage } from "@/lib/i18n/i18n";
import { rememberChoice } from "@/lib/i18n/choice";
import { PSEUDO_CLOSE, PSEUDO_OPEN } from "@/lib/i18n/pseudo";
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
  tips: outlookTips({
    days: [day(dates[2]!, "likely", 7, 3)],
    surface: getBuildingElement("corner-thermal-bridge"),
    wall: getBuildingElement("solid-wall"),
    forecast: true,
  }).map((tip) => ({ ...tip })),
  cautions: OUTLOOK_CAUTIONS.map((c) => ({ ...c })),
  method: OUTLOOK_METHOD.map((m) => ({ ...m })),
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
    expect(within(tips).getByText(/for about 15 to 20 minutes after/)).toBeInTheDocument();
    expect(within(tips).getByText(/about 5 cm/)).toBeInTheDocument();
    expect(within(tips).getAllByText(/Basis: common practice, no source/)).toHaveLength(outlook.tips.length);
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

  it("shows how the outlook is worked out, with the levels' figures", async () => {
    render(outlook);
    const card = await screen.findByRole("region", { name: /Condensation outlook/ });
    const method = within(card).getByText("How we work this out").closest("details")!;
    expect(within(method).getAllByRole("listitem", { hidden: true })).toHaveLength(OUTLOOK_METHOD.length);
    expect(method).toHaveTextContent(
      "possible with any such hour or 4 or more hours at 80 % surface humidity or above; unlikely otherwise.",
    );
  });
});

/** Text nodes under `root` with Latin words outside ⟦ ⟧ and outside translate="no": English that skipped translation. */
function untranslated(root: Element): string[] {
  const found: string[] = [];
  const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
  for (let node = walker.nextNode(); node; node = walker.nextNode()) {
    const text = node.textContent ?? "";
    if (node.parentElement?.closest('[translate="no"], script, style, title')) continue;
    const outside = text.replace(new RegExp(`${PSEUDO_OPEN}[^${PSEUDO_CLOSE}]*${PSEUDO_CLOSE}`, "g"), "");
    if (/[A-Za-z]{2,}/.test(outside)) found.push(text.trim());
  }
  return found;
}

describe("the condensation outlook card in other languages", () => {
  beforeEach(() => {
    clearCsrfToken();
    window.localStorage.clear();
  });
  afterEach(async () => {
    window.localStorage.clear();
    await showLanguage("en");
  });

  it("gives the tips, cautions and method in Welsh, with the same figures and cautions", async () => {
    rememberChoice("cy");
    await showLanguage("cy");
    render(outlook);
    const card = await screen.findByRole("region", { name: /Rhagolwg anwedd/ });
    const table = await within(card).findByRole("table", { name: "Y siawns o anwedd fesul ystafell a diwrnod" });
    expect(within(table).getByRole("columnheader", { name: /Heddiw/ })).toBeInTheDocument();
    expect(within(table).getByRole("columnheader", { name: /Yfory/ })).toBeInTheDocument();
    expect(within(table).getByRole("columnheader", { name: /Dydd Mercher/ })).toBeInTheDocument();
    expect(within(card).getByText(/rydyn ni wedi cymryd 18\.0 °C a lleithder 60 %/)).toBeInTheDocument();

    const tips = within(card).getByRole("region", { name: "Beth sy’n helpu" });
    expect(within(tips).getByText(/am tua 15 i 20 munud wedyn/)).toBeInTheDocument();
    expect(within(tips).getByText(/tua 5 cm/)).toBeInTheDocument();
    expect(within(tips).getAllByText(/Sail: arfer cyffredin, dim ffynhonnell/)).toHaveLength(outlook.tips.length);
    const cautions = within(card).getByRole("region", { name: "Cofiwch" });
    expect(within(cautions).getAllByRole("listitem")).toHaveLength(OUTLOOK_CAUTIONS.length);
    // The safety cautions say the same in Welsh: no cooker or unflued heater for warmth, vents clear, report damp.
    expect(within(cautions).getByText(/carbon monocsid/)).toBeInTheDocument();
    expect(within(cautions).getByText(/Peidiwch â rhwystro briciau aer/)).toBeInTheDocument();
    expect(within(cautions).getByText(/rhowch wybod i’ch landlord, beth bynnag/)).toBeInTheDocument();
    expect(within(cautions).getByText(/GIG 111/)).toBeInTheDocument();
    const method = within(card).getByText("Sut rydyn ni’n cyfrifo hyn").closest("details")!;
    expect(method).toHaveTextContent("neu 4 awr neu fwy ar leithder arwyneb o 80 % neu uwch");
    expect(card).not.toHaveTextContent(/trickle vents|Never use|common practice/);
  });

  it("leaves no English on the card in the pseudo-locale", async () => {
    rememberChoice("en-XA");
    await showLanguage("en-XA");
    render(outlook);
    const table = await screen.findByRole("table");
    const card = table.closest("#home-outlook")!;
    expect(untranslated(card)).toEqual([]);
  });

  it("says in English exactly what the domain says, so staff and tenants read the same words", async () => {
    // The en-GB messages and the domain's English (shown to staff and sent by the API) are one wording.
    const messages = i18n.getResourceBundle("en-GB", "home") as { outlook: Record<string, Record<string, string>> };
    const lines = [
      ...OUTLOOK_CAUTIONS.map((l) => ["advice", l] as const),
      ...outlookTips({
        days: [],
        surface: getBuildingElement("single-glazing"),
        wall: getBuildingElement("solid-wall"),
        forecast: false,
      }).map((l) => ["advice", l] as const),
      ...outlook.tips.map((l) => ["advice", l] as const),
      ...OUTLOOK_METHOD.map((l) => ["methodLines", l] as const),
    ];
    for (const [group, line] of lines) {
      expect(new IntlMessageFormat(messages.outlook[group]![line.id]!, "en-GB").format(line.values)).toBe(line.text);
    }
  });
});
