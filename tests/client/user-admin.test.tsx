// The admin's person panel: every change waits for a confirmation, and nothing is sent when it is
// cancelled; the history reads in plain words. Admins open the staff screens, and are never told to
// ask the administrator.
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, mockApi, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const base = { lastSignInAt: null, createdAt: "2025-01-01T00:00:00.000Z" };
const priya = { ...base, id: 2, email: "officer@example.org", name: "Priya Venn", role: "officer", status: "active" } as const;
const sam = { ...base, id: 5, email: "sam@example.org", name: "Sam Newell", role: "maintenance", status: "invited" } as const;
const me = { ...base, id: 1, email: "admin@example.org", name: "Morgan Castell", role: "admin", status: "active" } as const;

function setup(overrides: Record<string, MockReply> = {}) {
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/users": { body: { items: [me, priya, sam], total: 3, page: 1, pageSize: 25 } },
    "GET /api/users/2/history": {
      body: {
        entries: [
          {
            id: 9,
            action: "role-changed",
            actor: { id: 1, name: "Morgan Castell" },
            from: "maintenance",
            to: "officer",
            at: "2026-01-12T10:15:00.000Z",
          },
          {
            id: 8,
            action: "invitation-accepted",
            actor: { id: 2, name: "Priya Venn" },
            from: null,
            to: null,
            at: "2026-01-05T09:00:00.000Z",
          },
        ],
      },
    },
    "GET /api/users/5/history": { body: { entries: [] } },
    "GET /api/users/1/history": { body: { entries: [] } },
    "PATCH /api/users/2": (call: RecordedCall) => ({ body: { ...priya, ...(call.body as object) } }),
    "POST /api/auth/invitations/5/resend": { status: 201, body: { userId: 5, expiresAt: "2026-01-15T10:00:00.000Z" } },
    "POST /api/auth/invitations/5/cancel": { status: 204 },
    ...overrides,
  });
  return { ...api, ...renderApp("/admin") };
}

async function openPanel(name: string) {
  const table = await screen.findByRole("table", { name: "People in your organisation" });
  await within(table).findByText(name);
  await userEvent.setup().click(within(table).getByRole("button", { name: `Manage ${name}` }));
  return screen.findByRole("region", { name });
}

describe("managing a person", () => {
  beforeEach(() => clearCsrfToken());

  it("changes the role only after confirming, showing what changes; cancelling sends nothing", async () => {
    const { callsTo } = setup();
    const panel = await openPanel("Priya Venn");
    const user = userEvent.setup();

    // The history in plain words, newest first.
    expect(
      await within(panel).findByText("Morgan Castell changed the role from maintenance lead to housing officer."),
    ).toBeInTheDocument();
    expect(within(panel).getByText("They accepted the invitation and chose a password.")).toBeInTheDocument();

    await user.selectOptions(within(panel).getByRole("combobox", { name: "Role" }), "maintenance");
    await user.click(within(panel).getByRole("button", { name: "Save changes" }));
    let dialog = await screen.findByRole("dialog", { name: "Save changes to Priya Venn's account?" });
    expect(within(dialog).getByText(/Role: Housing officer → Maintenance lead/)).toBeInTheDocument();
    await user.click(within(dialog).getByRole("button", { name: "Cancel" }));
    expect(callsTo("PATCH", "/api/users/2")).toHaveLength(0);

    await user.click(within(panel).getByRole("button", { name: "Save changes" }));
    dialog = await screen.findByRole("dialog", { name: "Save changes to Priya Venn's account?" });
    await user.click(within(dialog).getByRole("button", { name: "Save changes" }));
    expect(await within(panel).findByText("Priya Venn's details are saved.")).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/users/2").map((c) => c.body)).toEqual([{ role: "maintenance" }]);
  });

  it("checks the name before asking, and shows the server's refusal inside the dialog", async () => {
    const { callsTo } = setup({ "PATCH /api/users/2": apiError(409, "conflict", "This is the only active administrator.") });
    const panel = await openPanel("Priya Venn");
    const user = userEvent.setup();
    const name = within(panel).getByRole("textbox", { name: "Name" });
    await user.clear(name);
    await user.click(within(panel).getByRole("button", { name: "Save changes" }));
    expect(name).toHaveAccessibleDescription("Enter the person's name.");
    expect(screen.queryByRole("dialog")).not.toBeInTheDocument();

    await user.type(name, "Priya Venn-Okafor");
    await user.click(within(panel).getByRole("button", { name: "Save changes" }));
    const dialog = await screen.findByRole("dialog", { name: "Save changes to Priya Venn's account?" });
    expect(within(dialog).getByText(/Name: Priya Venn → Priya Venn-Okafor/)).toBeInTheDocument();
    await user.click(within(dialog).getByRole("button", { name: "Save changes" }));
    expect(await within(dialog).findByText("This is the only active administrator.")).toBeInTheDocument();
    expect(callsTo("PATCH", "/api/users/2").map((c) => c.body)).toEqual([{ name: "Priya Venn-Okafor" }]);
  });

  it("sends an invitation again, or cancels it, each after confirming", async () => {
    const { callsTo } = setup();
    const panel = await openPanel("Sam Newell");
    const user = userEvent.setup();
    expect(within(panel).getByText("They have not accepted their invitation yet.")).toBeInTheDocument();
    expect(within(panel).queryByRole("button", { name: "Disable account" })).not.toBeInTheDocument();

    await user.click(within(panel).getByRole("button", { name: "Send the invitation again" }));
    let dialog = await screen.findByRole("dialog", { name: "Send Sam Newell's invitation again?" });
    expect(dialog).toHaveTextContent("The link in the earlier e-mail stops working.");
    await user.click(within(dialog).getByRole("button", { name: "Cancel" }));
    expect(callsTo("POST", "/api/auth/invitations/5/resend")).toHaveLength(0);
    await user.click(within(panel).getByRole("button", { name: "Send the invitation again" }));
    await user.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Send it again" }));
    expect(await within(panel).findByText(/The invitation went to sam@example\.org again\./)).toBeInTheDocument();
    expect(callsTo("POST", "/api/auth/invitations/5/resend")).toHaveLength(1);

    await user.click(within(panel).getByRole("button", { name: "Cancel the invitation" }));
    dialog = await screen.findByRole("dialog", { name: "Cancel Sam Newell's invitation?" });
    await user.click(within(dialog).getByRole("button", { name: "Keep it" }));
    expect(callsTo("POST", "/api/auth/invitations/5/cancel")).toHaveLength(0);
    await user.click(within(panel).getByRole("button", { name: "Cancel the invitation" }));
    await user.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Cancel the invitation" }));
    expect(await within(panel).findByText("Sam Newell's invitation is cancelled.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/auth/invitations/5/cancel")).toHaveLength(1);
    expect(within(panel).getByText("Invitation cancelled")).toBeInTheDocument();
    expect(within(panel).queryByRole("button", { name: "Send the invitation again" })).not.toBeInTheDocument();
  });

  it("does not offer an admin their own role or status", async () => {
    setup();
    const panel = await openPanel("Morgan Castell");
    expect(within(panel).getByRole("combobox", { name: "Role" })).toBeDisabled();
    expect(within(panel).getByRole("combobox", { name: "Role" })).toHaveAccessibleDescription(/cannot change your own role/);
    expect(within(panel).queryByRole("button", { name: "Disable account" })).not.toBeInTheDocument();
  });
});

describe("admins and the staff screens", () => {
  beforeEach(() => clearCsrfToken());

  it("lets an admin open the case queue from the menu", async () => {
    mockApi({
      "GET /api/auth/me": { body: users.admin },
      "GET /api/staff": { body: { users: [] } },
      "GET /api/properties/estates": { body: { estates: [] } },
      "GET /api/cases": { body: { items: [], total: 0, page: 1, pageSize: 25 } },
      "GET /api/users": { body: { items: [me], total: 1, page: 1, pageSize: 25 } },
    });
    renderApp("/admin");
    const nav = await screen.findByRole("navigation", { name: "Main" });
    await userEvent.setup().click(within(nav).getByRole("link", { name: "Case queue" }));
    expect(await screen.findByRole("heading", { level: 1, name: "Case queue" })).toBeInTheDocument();
    expect(screen.queryByText(/Not allowed/)).not.toBeInTheDocument();
    expect(within(nav).getByRole("link", { name: "Works" })).toBeInTheDocument();
  });

  it("never tells an admin to ask the administrator on a page that is not for them", async () => {
    mockApi({ "GET /api/auth/me": { body: users.admin } });
    renderApp("/report");
    expect(await screen.findByRole("heading", { level: 1, name: "Not allowed" })).toBeInTheDocument();
    const main = screen.getByRole("main");
    expect(main).toHaveTextContent("Your account cannot open this page");
    expect(main).not.toHaveTextContent(/ask .*administrator/i);
  });
});
