// The "advice for your home" section on the tenant's case page: the server's ranked items with why,
// rough cost, cautions and source; the oven and hob caution always shown; the landlord's help with
// heating costs when the tenant asked for it, or neutral wording when the landlord has set none.
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { adviseForHome, type HomeAdviceFacts } from "@/lib/domain/home-advice";
import type { HomeAdviceResponse } from "@/lib/contracts/home-advice";
import { mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const theCase = {
  id: 42,
  reference: "DW-2026-00042",
  status: "triaged",
  assigneeId: null,
  hazardClass: null,
  hazardClassReason: null,
  tenantUserId: users.tenant.id,
  channel: "tenant-online",
  awareAt: "2026-01-10T08:00:00.000Z",
  createdAt: "2026-01-10T08:00:00.000Z",
  description: "Black mould in the bedroom corner",
  locations: ["corner"],
  observations: ["mould-spots"],
  since: "months",
  area: "a4",
  vulnerability: null,
  equipment: { heatingCost: "hard-to-afford" },
  property: {
    id: 5,
    addressLine1: "3 Fenwick Yard",
    addressLine2: null,
    town: "Easterby",
    postcode: "ZX3 1AB",
    estate: "Fenwick",
  },
  rooms: [{ id: 2, name: "Bedroom", kind: "bedroom" }],
  homeRooms: [{ id: 2, name: "Bedroom", kind: "bedroom" }],
};

// Our own fiction: a solid brick terrace with single glazing, worked out by the real rules.
const facts: HomeAdviceFacts = {
  wallType: "solid-brick",
  glazingType: "single",
  heatingType: "gas-boiler",
  ventilation: "trickle-vents-and-fans",
  roomKinds: ["bedroom"],
  riskState: null,
  observations: ["mould-spots"],
  heatingCost: "hard-to-afford",
};
const { items, safety } = adviseForHome(facts);

function adviceApi(advice: HomeAdviceResponse, status = "triaged") {
  return mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/cases/42": { body: { ...theCase, status } },
    "GET /api/cases/42/events": { body: { events: [] } },
    "GET /api/cases/42/advice": { body: advice },
  });
}

async function openCase() {
  renderApp("/cases/42");
  expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
}

/** The section is one press away, like the page's other parts: press its heading. */
async function openAdvice() {
  const button = await screen.findByRole("button", { name: "Advice for your home" });
  await userEvent.setup().click(button);
  expect(button).toHaveAttribute("aria-expanded", "true");
}

describe("advice for your home", () => {
  beforeEach(() => clearCsrfToken());

  it("lists the advice for this home with why, rough cost, cautions and source, and the safety caution", async () => {
    adviceApi({ caseId: 42, items, safety, support: { text: null, phone: null, link: null } });
    await openCase();
    await openAdvice();
    const section = await screen.findByRole("region", { name: "Advice for your home" });
    const list = await within(section).findByRole("list", { name: "Things that may help, most helpful first" });
    expect(
      within(list)
        .getAllByRole("heading", { level: 3 })
        .map((h) => h.textContent),
    ).toEqual([
      "Steady, low warmth rather than none",
      "Clear window film on single glazing, if your landlord agrees",
      "Reflector panels behind radiators on outside walls",
      "Stop draughts, but never block a vent",
    ]);
    expect(items.map((i) => i.id)).toEqual(["steady-low-heat", "window-film", "radiator-reflector", "draught-proofing"]);
    // The item's words follow this home's facts: radiators, solid brick walls and single glazing, heating hard to afford.
    expect(within(section).getByText(/Use the radiator valves to keep every room a little warm/)).toBeInTheDocument();
    expect(
      within(section).getByText(
        /Your home has solid brick walls and single glazing, which get cold\. .*There is help with costs below\./,
      ),
    ).toBeInTheDocument();
    expect(within(section).getByText(/Your home has solid brick walls, which lose heat quickly/)).toBeInTheDocument();
    expect(within(section).getAllByText(/ISO 13788 \(surface temperature factor\)/).length).toBe(2);
    expect(within(section).getByText(/Clear window film on single glazing, if your landlord agrees/)).toBeInTheDocument();
    expect(within(section).getAllByText("Under £20").length).toBeGreaterThan(0);
    expect(within(section).getByText(/Never block trickle vents, air bricks or extractor fans/)).toBeInTheDocument();
    expect(within(section).getByText(/Stay safe: Never heat a room with an oven, hob or bottled gas heater/)).toBeInTheDocument();
    expect(within(section).getByText(/a gas you cannot see or smell/)).toBeInTheDocument();
    expect(within(section).getAllByText(/Where this comes from:/).length).toBe(items.length + 1);
    // No landlord route set: neutral wording, no organisation or number.
    const help = within(section).getByRole("region", { name: "Help with heating costs" });
    expect(help).toHaveTextContent(/Tell your landlord: they may know of help with bills/);
    expect(within(help).queryByRole("link")).toBeNull();
  });

  it("shows the landlord's own help with heating costs, with a number to call", async () => {
    adviceApi({ caseId: 42, items, safety, support: { text: "Our money team can help.", phone: "0300 123 4567", link: null } });
    await openCase();
    await openAdvice();
    const help = await screen.findByRole("region", { name: "Help with heating costs" });
    expect(help).toHaveTextContent("Our money team can help.");
    expect(within(help).getByRole("link", { name: "0300 123 4567" })).toHaveAttribute("href", "tel:03001234567");
  });

  it("is not shown once the case is closed", async () => {
    adviceApi({ caseId: 42, items, safety, support: null }, "closed");
    await openCase();
    expect(screen.queryByRole("region", { name: "Advice for your home" })).toBeNull();
    expect(screen.queryByRole("button", { name: "Advice for your home" })).toBeNull();
  });
});
