import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { makeProperty, mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const homeRooms = [
  { id: 1, name: "Living room", kind: "living" },
  { id: 2, name: "Bedroom 1", kind: "bedroom" },
];

const aCase = (id: number, status: string, createdAt: string, rooms: typeof homeRooms) => ({
  id,
  reference: `DW-2026-${String(id).padStart(5, "0")}`,
  status,
  assigneeId: null,
  hazardClass: null,
  hazardClassReason: null,
  tenantUserId: users.tenant.id,
  channel: "tenant-online",
  awareAt: createdAt,
  createdAt,
  description: `Report number ${id}`,
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
  rooms,
  homeRooms,
  photoCount: 0,
  thumbnailUrl: null,
});

const cases = [
  aCase(44, "inspection-booked", "2026-02-03T10:00:00.000Z", [homeRooms[1]!]),
  aCase(43, "new", "2026-01-20T10:00:00.000Z", homeRooms),
  aCase(41, "closed", "2025-11-02T10:00:00.000Z", []),
  aCase(40, "works-done", "2025-10-02T10:00:00.000Z", []),
];

const myHome = { tenancy: { id: 4, startDate: "2021-04-12", endDate: null }, property: { ...makeProperty(5), rooms: homeRooms } };

describe("my reports", () => {
  beforeEach(() => clearCsrfToken());

  it("lists the tenant's reports newest first, in plain words", async () => {
    mockApi({ "GET /api/auth/me": { body: users.tenant }, "GET /api/me/cases": { body: { items: cases } } });
    const { router } = renderApp("/cases");
    expect(await screen.findByRole("heading", { level: 1, name: "My reports" })).toBeInTheDocument();
    const items = await within(screen.getByRole("main")).findAllByRole("listitem");
    expect(items).toHaveLength(4);
    const first = items[0]!;
    expect(within(first).getByRole("link", { name: "DW-2026-00044" })).toHaveAttribute("href", "/cases/44");
    expect(within(first).getByText("Visit booked")).toBeInTheDocument();
    expect(within(first).getByText("3 February 2026")).toBeInTheDocument();
    expect(within(first).getByText("Bedroom 1")).toBeInTheDocument();
    expect(within(items[1]!).getByText("Living room, Bedroom 1")).toBeInTheDocument();
    expect(within(items[1]!).getByText("Sent")).toBeInTheDocument();
    expect(within(items[2]!).getByText("Finished")).toBeInTheDocument();

    await userEvent.setup().click(screen.getByRole("link", { name: "Report damp or mould" }));
    expect(await screen.findByRole("heading", { level: 1, name: "Report damp or mould" })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe("/report");
  });

  it("offers the report button when there are no reports yet", async () => {
    mockApi({ "GET /api/auth/me": { body: users.tenant }, "GET /api/me/cases": { body: { items: [] } } });
    renderApp("/cases");
    expect(await screen.findByText("You haven't sent any reports yet")).toBeInTheDocument();
    expect(screen.getAllByRole("link", { name: "Report damp or mould" }).length).toBeGreaterThanOrEqual(1);
  });

  it("puts the report button and the newest reports on My home", async () => {
    mockApi({
      "GET /api/auth/me": { body: users.tenant },
      "GET /api/me/home": { body: myHome },
      "GET /api/me/cases": { body: { items: cases } },
    });
    renderApp("/home");
    expect(await screen.findByRole("heading", { level: 1, name: "My home" })).toBeInTheDocument();
    expect(await screen.findByRole("link", { name: "Report damp or mould" })).toHaveAttribute("href", "/report");
    const reports = screen.getByRole("region", { name: "Your reports" });
    expect(await within(reports).findAllByRole("link", { name: /^DW-2026-/ })).toHaveLength(3);
    expect(within(reports).getByRole("link", { name: "See all 4 reports" })).toHaveAttribute("href", "/cases");
    expect(screen.queryByText("Coming soon")).not.toBeInTheDocument();
  });

  it("does not let staff open a tenant's report screens", async () => {
    mockApi({ "GET /api/auth/me": { body: users.officer } });
    renderApp("/report");
    expect(await screen.findByRole("heading", { level: 1, name: "Not allowed" })).toBeInTheDocument();
  });
});
