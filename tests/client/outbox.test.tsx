// Staff see each e-mail's state and can send one again: the admin's E-mails list (filtered by state,
// kept in the URL) and the "Send again" button beside it.
import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { mockApi, users, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const base = {
  template: "caseAcknowledgement",
  createdAt: "2026-01-10T08:00:00.000Z",
  lastAttemptAt: "2026-01-10T08:00:01.000Z",
  resentAt: null,
  nextAttemptAt: null,
  sentAt: null,
  error: null,
  attempts: 1,
};
const sent = {
  ...base,
  id: 11,
  to: "robin@example.org",
  subject: "We have your report DW-2026-00011",
  status: "sent",
  sentAt: "2026-01-10T08:00:02.000Z",
  case: { id: 42 },
} as const;
const failed = {
  ...base,
  id: 12,
  to: "ola@example.org",
  subject: "A message about your report DW-2026-00012",
  status: "failed",
  attempts: 20,
  error: "550 Mailbox unavailable",
  case: { id: 43 },
} as const;
const retrying = {
  ...base,
  id: 13,
  to: "kit@example.org",
  subject: "Got worse: DW-2026-00013",
  status: "pending",
  attempts: 2,
  error: "connect ECONNREFUSED",
  nextAttemptAt: "2026-01-10T08:02:00.000Z",
  case: null,
} as const;

function setup() {
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/outbox": (call: RecordedCall) => {
      const status = call.search.get("status");
      const items = [sent, failed, retrying].filter((i) => !status || i.status === status);
      return { body: { items, total: items.length, page: 1, pageSize: 25 } };
    },
    "POST /api/outbox/12/resend": { status: 202, body: { ...failed, status: "pending", attempts: 0, error: null } },
  });
  return { ...api, ...renderApp("/admin/emails") };
}

describe("the admin's e-mails", () => {
  beforeEach(() => clearCsrfToken());

  it("lists each e-mail's state, filters by state, and sends a failed one again", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    const table = await screen.findByRole("table", { name: "E-mails sent by Dewline for your organisation" });
    await within(table).findByText("robin@example.org");
    expect(within(table).getByText("550 Mailbox unavailable")).toBeInTheDocument();
    expect(within(table).getByText(/Tried 2 times; next try/)).toBeInTheDocument();
    // Nothing to press for an e-mail still queued: it goes by itself.
    expect(within(table).queryByRole("button", { name: "Send the e-mail to kit@example.org again" })).toBeNull();

    await user.selectOptions(screen.getByRole("combobox", { name: "Filter by state" }), "failed");
    // Wait for the filtered list itself (the failed e-mail was listed before the filter too).
    await waitFor(() => expect(within(table).queryByText("robin@example.org")).toBeNull());
    expect(within(table).getByText("ola@example.org")).toBeInTheDocument();
    expect(callsTo("GET", "/api/outbox").at(-1)!.search.get("status")).toBe("failed");

    await user.click(within(table).getByRole("button", { name: "Send the e-mail to ola@example.org again" }));
    expect(await within(table).findByText("It will be sent again in a moment.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/outbox/12/resend")).toHaveLength(1);
  });
});
