import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, makeProperty, mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const people = [
  {
    id: 1,
    email: "admin@example.org",
    name: "Morgan Castell",
    role: "admin",
    status: "active",
    lastSignInAt: "2025-12-02T09:15:00.000Z",
    createdAt: "2025-01-01T00:00:00.000Z",
  },
  {
    id: 2,
    email: "officer@example.org",
    name: "Priya Venn",
    role: "officer",
    status: "active",
    lastSignInAt: null,
    createdAt: "2025-01-01T00:00:00.000Z",
  },
  {
    id: 5,
    email: "new@example.org",
    name: "Sam Newell",
    role: "tenant",
    status: "invited",
    lastSignInAt: null,
    createdAt: "2025-11-30T00:00:00.000Z",
  },
];

function setup() {
  let officerStatus = "active";
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/users": () => ({
      body: { items: people.map((p) => (p.id === 2 ? { ...p, status: officerStatus } : p)), total: 3, page: 1, pageSize: 25 },
    }),
    "PATCH /api/users/2": (call) => {
      officerStatus = (call.body as { status: string }).status;
      return { body: { ...people[1], status: officerStatus } };
    },
    "GET /api/users/2/history": { body: { entries: [] } },
    "GET /api/properties": (call) => ({
      body: {
        items: call.search.get("q")
          ? [makeProperty(7, { addressLine1: "7 Heron Walk", addressLine2: null })]
          : [makeProperty(1), makeProperty(2)],
        total: call.search.get("q") ? 1 : 2,
        page: 1,
        pageSize: 20,
      },
    }),
    "POST /api/auth/invitations": (call) =>
      (call.body as { email: string }).email === "officer@example.org"
        ? apiError(409, "conflict", "Someone with that e-mail address already has an account.")
        : { status: 201, body: { expiresAt: "2025-12-05T10:00:00.000Z" } },
  });
  return { ...api, ...renderApp("/admin") };
}

describe("Users and invitations", () => {
  beforeEach(() => clearCsrfToken());

  it("lists people and disables an account after confirming", async () => {
    const { callsTo } = setup();
    expect(await screen.findByRole("heading", { level: 1, name: "Users and invitations" })).toBeInTheDocument();
    const table = await screen.findByRole("table", { name: "People in your organisation" });
    await within(table).findByText("Priya Venn");
    expect(within(table).getByText("This is you")).toBeInTheDocument();
    expect(within(table).getByText("Invited")).toBeInTheDocument();

    const user = userEvent.setup();
    await user.click(within(table).getByRole("button", { name: "Manage Priya Venn" }));
    const panel = await screen.findByRole("region", { name: "Priya Venn" });
    await user.click(within(panel).getByRole("button", { name: "Disable account" }));
    const dialog = await screen.findByRole("dialog", { name: "Disable Priya Venn's account?" });
    await user.click(within(dialog).getByRole("button", { name: "Cancel" }));
    expect(callsTo("PATCH", "/api/users/2")).toHaveLength(0);

    await user.click(within(panel).getByRole("button", { name: "Disable account" }));
    await user.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Disable account" }));

    expect(await screen.findByText("Priya Venn's account is now disabled.")).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/users/2")[0]!.body).toEqual({ status: "disabled" });
    expect(await within(panel).findByRole("button", { name: "Enable account" })).toBeInTheDocument();
    await waitFor(() => expect(within(table).getByText("Disabled")).toBeInTheDocument());
  });

  it("filters by role through the URL", async () => {
    const { callsTo, router } = setup();
    await screen.findByRole("table", { name: "People in your organisation" });
    const user = userEvent.setup();
    await user.selectOptions(screen.getByRole("combobox", { name: "Filter by role" }), "officer");
    await waitFor(() => expect(callsTo("GET", "/api/users").at(-1)!.search.get("role")).toBe("officer"));
    expect(router.state.location.search).toBe("?role=officer");
  });

  it("invites a tenant to a chosen home and shows the conflict message for a known e-mail", async () => {
    const { callsTo } = setup();
    const form = (await screen.findByRole("heading", { name: "Invite someone" })).closest("section")!;
    const user = userEvent.setup();
    const inForm = within(form);

    await user.click(inForm.getByRole("button", { name: "Send invitation" }));
    expect(inForm.getByLabelText("Name")).toHaveAccessibleDescription("Enter the person's name.");
    expect(inForm.getByRole("combobox", { name: "Choose the home" })).toHaveAccessibleDescription(
      /Choose the home this tenant lives in\./,
    );

    await user.type(inForm.getByLabelText("Name"), "Alex Heron");
    await user.type(inForm.getByLabelText("E-mail address"), "alex@example.org");
    await user.type(inForm.getByRole("searchbox", { name: "Find a home" }), "Heron");
    const homeSelect = inForm.getByRole("combobox", { name: "Choose the home" });
    await within(homeSelect).findByRole("option", { name: /7 Heron Walk/ });
    await user.selectOptions(homeSelect, within(homeSelect).getByRole("option", { name: /7 Heron Walk/ }));
    await user.type(inForm.getByLabelText(/Household notes/), "Prefers phone calls in the afternoon.");
    await user.click(inForm.getByRole("button", { name: "Send invitation" }));

    expect(await inForm.findByText("Invitation sent to alex@example.org")).toBeInTheDocument();
    expect(callsTo("POST", "/api/auth/invitations")[0]!.body).toEqual({
      name: "Alex Heron",
      email: "alex@example.org",
      role: "tenant",
      propertyId: 7,
      householdNotes: "Prefers phone calls in the afternoon.",
    });

    await user.selectOptions(inForm.getByRole("combobox", { name: "Role" }), "officer");
    expect(inForm.queryByRole("combobox", { name: "Choose the home" })).not.toBeInTheDocument();
    await user.type(inForm.getByLabelText("Name"), "Priya Again");
    await user.type(inForm.getByLabelText("E-mail address"), "officer@example.org");
    await user.click(inForm.getByRole("button", { name: "Send invitation" }));

    expect(await inForm.findByRole("alert")).toHaveTextContent("Someone with that e-mail address already has an account.");
    expect(callsTo("POST", "/api/auth/invitations")[1]!.body).toEqual({
      name: "Priya Again",
      email: "officer@example.org",
      role: "officer",
    });
  });
});
