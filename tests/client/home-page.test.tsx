// A home's page for an admin: the details, and a room with readings that cannot be removed (the
// server's reason is shown in the confirmation, and the room stays).
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, makeProperty, mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const home = {
  ...makeProperty(7, { ventilation: "piv" }),
  rooms: [
    { id: 71, name: "Bedroom", kind: "bedroom" },
    { id: 72, name: "Kitchen", kind: "kitchen" },
  ],
};

describe("a home's page", () => {
  beforeEach(() => clearCsrfToken());

  it("shows the home to an admin and says why a room with readings stays", async () => {
    const api = mockApi({
      "GET /api/auth/me": { body: users.admin },
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "GET /api/properties/7": { body: home },
      "GET /api/properties/7/tenants": {
        body: {
          tenants: [
            {
              tenancyId: 1,
              userId: 11,
              name: "Robin Ashdown",
              email: "tenant@example.org",
              startDate: "2021-04-12",
              endDate: null,
              current: true,
              language: "cy",
            },
          ],
        },
      },
      "GET /api/properties/7/cases": { body: { cases: [] } },
      "GET /api/properties/7/readings": { body: { rooms: [] } },
      "DELETE /api/properties/7/rooms/71": apiError(
        409,
        "conflict",
        '"Bedroom" has 3 readings, so it cannot be removed: the readings belong to cases of this home. Rename it instead if its name is wrong.',
      ),
    });
    renderApp("/homes/7");

    expect(await screen.findByRole("heading", { level: 1, name: /Flat 7/ })).toBeInTheDocument();
    const details = screen.getByRole("region", { name: "Details" });
    expect(within(details).getByText("Positive input ventilation (PIV)")).toBeInTheDocument();
    expect(await screen.findByText("Robin Ashdown")).toBeInTheDocument();
    // Staff screens are English; the tenant reads Dewline in Welsh, and staff are told so.
    expect(screen.getByText("Prefers Welsh (Cymraeg)")).toBeInTheDocument();
    expect(screen.getByText("No cases yet")).toBeInTheDocument();

    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Remove Bedroom" }));
    const dialog = await screen.findByRole("dialog", { name: "Remove Bedroom?" });
    await user.click(within(dialog).getByRole("button", { name: "Remove the room" }));
    expect(await within(dialog).findByText(/has 3 readings, so it cannot be removed/)).toBeInTheDocument();
    expect(api.callsTo("DELETE", "/api/properties/7/rooms/71")).toHaveLength(1);
    await user.click(within(dialog).getByRole("button", { name: "Keep it" }));
    expect(
      within(screen.getByRole("region", { name: "Rooms" })).getByRole("button", { name: "Remove Bedroom" }),
    ).toBeInTheDocument();
  });
});
