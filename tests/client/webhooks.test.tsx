// The admin's Webhooks page: endpoints with their events, the signing secret shown once, each
// delivery with every attempt's answer and "Send again", and a confirmation before removing one.
import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const endpoint = {
  id: 7,
  url: "https://housing.example.org/dewline-events",
  description: "Housing system",
  eventTypes: ["case.created", "case.status-changed"],
  active: true,
  createdAt: "2026-01-10T08:00:00.000Z",
  secretRotatedAt: null,
  previousSecretUntil: null,
  pending: 1,
  failed: 0,
} as const;

const delivery = {
  id: 31,
  eventId: "4b0f3c1e-5a43-4f0e-9d0b-1f0c2a3b4c5d",
  eventType: "case.created",
  occurredAt: "2026-01-10T09:00:00.000Z",
  case: { id: 42, reference: "DW-2026-00042" },
  status: "pending",
  attempts: 1,
  nextAttemptAt: "2026-01-10T09:00:31.000Z",
  deliveredAt: null,
  history: [{ at: "2026-01-10T09:00:01.000Z", statusCode: 500, error: "The receiver answered 500.", durationMs: 42 }],
} as const;

const adminAction = {
  id: 3,
  action: "webhook-secret-replaced",
  subject: { kind: "webhook", id: 7 },
  detail: "https://housing.example.org/dewline-events (the old secret signs too for 24 hours)",
  by: { id: 5, name: "Asha Okafor" },
  at: "2026-01-11T10:00:00.000Z",
} as const;

function setup(items: object[] = [endpoint]) {
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/webhooks": { body: { items } },
    "POST /api/webhooks": {
      status: 201,
      body: {
        endpoint: { ...endpoint, id: 8, url: "https://reports.example.org/in", description: "" },
        secret: "whsec_shown-once",
      },
    },
    "DELETE /api/webhooks/7": { status: 204 },
    "GET /api/webhooks/7/deliveries": { body: { items: [delivery], total: 1, page: 1, pageSize: 20 } },
    "POST /api/webhooks/7/deliveries/31/resend": { status: 202, body: { ...delivery, attempts: 0 } },
    "GET /api/integrations/admin-actions": { body: { entries: [adminAction] } },
  });
  return { ...api, ...renderApp("/admin/webhooks") };
}

describe("the admin's webhooks", () => {
  beforeEach(() => clearCsrfToken());

  it("says so when there are no endpoints, and shows a new endpoint's secret once", async () => {
    const { callsTo } = setup([]);
    const user = userEvent.setup();
    expect(await screen.findByText("No endpoints yet")).toBeInTheDocument();
    await user.type(screen.getByRole("textbox", { name: /Address/ }), "https://reports.example.org/in");
    await user.click(screen.getByRole("checkbox", { name: "A work order is booked" }));
    await user.click(screen.getByRole("button", { name: "Add the endpoint" }));
    expect(await screen.findByText("whsec_shown-once")).toBeInTheDocument();
    const sent = callsTo("POST", "/api/webhooks")[0]!.body as { eventTypes: string[] };
    expect(sent.eventTypes).not.toContain("work-order.booked");
    expect(sent.eventTypes).toContain("case.created");
    await user.click(screen.getByRole("button", { name: "I have stored it" }));
    expect(screen.queryByText("whsec_shown-once")).toBeNull();
  });

  it("refuses an address that is not one before sending anything", async () => {
    const { callsTo } = setup([]);
    const user = userEvent.setup();
    await user.type(await screen.findByRole("textbox", { name: /Address/ }), "housing system");
    await user.click(screen.getByRole("button", { name: "Add the endpoint" }));
    expect(await screen.findByText(/Enter a full address/)).toBeInTheDocument();
    expect(callsTo("POST", "/api/webhooks")).toHaveLength(0);
  });

  it("shows each delivery's attempts with the receiver's answer, and sends one again", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Show deliveries" }));
    const attempts = await screen.findByRole("list", { name: "Attempts, newest first" });
    expect(within(attempts).getByText(/answered 500, 42 ms/)).toBeInTheDocument();
    expect(screen.getByText("DW-2026-00042")).toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: /^Send again: A case is reported, / }));
    expect(callsTo("POST", "/api/webhooks/7/deliveries/31/resend")).toHaveLength(1);
  });

  it("asks before removing an endpoint", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Remove" }));
    const dialog = await screen.findByRole("dialog", { name: "Remove Housing system?" });
    await user.click(within(dialog).getByRole("button", { name: "Cancel" }));
    expect(callsTo("DELETE", "/api/webhooks/7")).toHaveLength(0);
    await user.click(screen.getByRole("button", { name: "Remove" }));
    await user.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Remove the endpoint" }));
    expect(callsTo("DELETE", "/api/webhooks/7")).toHaveLength(1);
  });

  it("lists who changed the endpoints and when, asking for webhook changes only, and again after a change", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    const table = await screen.findByRole("table", { name: "Changes made by admins, newest first" });
    expect(within(table).getByText("Webhook signing secret replaced")).toBeInTheDocument();
    expect(within(table).getByText("Asha Okafor")).toBeInTheDocument();
    expect(callsTo("GET", "/api/integrations/admin-actions")[0]!.search.get("subject")).toBe("webhook");
    await user.click(screen.getByRole("button", { name: "Remove" }));
    await user.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Remove the endpoint" }));
    await waitFor(() => expect(callsTo("GET", "/api/integrations/admin-actions").length).toBe(2));
  });
});
