// The admin's tenancy import page: choose a file, correct a column the server did not recognise,
// confirm, see the outcome; and the invitations' progress with pause and a confirmed stop.
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const noColumns = {
  reference: 0,
  uprn: 1,
  name: 2,
  firstName: null,
  lastName: null,
  email: null,
  phone: null,
  startDate: 4,
  endDate: null,
  language: null,
  accessNeeds: null,
  vulnerability: null,
  consent: null,
};
const preview = {
  fileKind: "csv",
  headers: ["Ref", "UPRN", "Name", "Contact", "Start"],
  mapping: noColumns,
  missing: ["e-mail"],
  sampleRows: [["T-1", "100023336956", "Ada Mould", "ada@example.org", "2024-04-01"]],
  rows: 2,
} as const;
const summary = {
  id: 7,
  fileName: "tenancies.csv",
  createdAt: "2026-01-10T08:00:00.000Z",
  createdBy: "Test admin",
  rows: 4000,
  created: 3990,
  updated: 0,
  unchanged: 0,
  rejected: 10,
  invitations: {
    batchId: 3,
    total: 4000,
    sent: 1200,
    skipped: 0,
    cancelled: 0,
    pending: 2800,
    state: "sending",
    nextReleaseAt: "2026-01-10T08:07:00.000Z",
  },
} as const;
const result = {
  ...summary,
  id: 8,
  rows: 2,
  created: 1,
  rejected: 1,
  invitations: { ...summary.invitations, batchId: 4, total: 1, sent: 0, pending: 1 },
  notableTotal: 2,
  notable: [
    {
      row: 2,
      reference: "T-1",
      outcome: "created",
      changes: [],
      reasons: ["Invitation queued: it goes out with the next batches."],
    },
    {
      row: 3,
      reference: "T-2",
      outcome: "rejected",
      changes: [],
      reasons: ['"12AB" is not a UPRN (a number of up to 12 digits).'],
    },
  ],
} as const;

function setup(items: unknown[] = [summary]) {
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/tenancy-imports": { body: { items } },
    "POST /api/tenancy-imports/preview": { body: preview },
    "POST /api/tenancy-imports": { status: 201, body: result },
    "POST /api/tenancy-imports/7/invitations/pause": { status: 204 },
    "POST /api/tenancy-imports/7/invitations/cancel": { status: 204 },
  });
  return { ...api, ...renderApp("/admin/tenancy-import") };
}

describe("tenancy import", () => {
  beforeEach(() => clearCsrfToken());

  it("previews the file, lets the admin choose the missing column, and imports after a confirmation", async () => {
    const { fetchMock } = setup();
    const user = userEvent.setup();
    await screen.findByRole("heading", { name: "Tenancy import" });
    const file = new File(["Ref,UPRN,Name,Contact,Start\n"], "tenancies.csv", { type: "text/csv" });
    await user.upload(screen.getByLabelText("Tenancy file (CSV or .xlsx)"), file);
    expect(await screen.findByText(/Choose the columns for: e-mail/)).toBeInTheDocument();
    await user.selectOptions(screen.getByRole("combobox", { name: "E-mail address" }), "Contact");
    await user.click(screen.getByRole("button", { name: "Import 2 rows" }));
    const dialog = await screen.findByRole("dialog", { name: "Import these tenancies?" });
    await user.click(within(dialog).getByRole("button", { name: "Import" }));
    expect(await screen.findByText(/1 added, 0 updated, 0 unchanged,\s+1 not imported/)).toBeInTheDocument();
    expect(screen.getByText('"12AB" is not a UPRN (a number of up to 12 digits).')).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Download the report for every row (CSV)" })).toHaveAttribute(
      "href",
      "/api/tenancy-imports/8/report.csv",
    );
    const sent = fetchMock.mock.calls.find(([url, init]) => String(url) === "/api/tenancy-imports" && init?.method === "POST");
    const mapping = JSON.parse(String((sent?.[1]?.body as FormData).get("mapping")));
    expect(mapping.email).toBe(3);
  });

  it("shows the invitations' progress, pauses them, and stops the rest only after a confirmation", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    expect(await screen.findByText(/1,200 of 4,000 invited, next batch at/)).toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: "Pause" }));
    expect(callsTo("POST", "/api/tenancy-imports/7/invitations/pause")).toHaveLength(1);
    await user.click(screen.getByRole("button", { name: "Stop the rest" }));
    const dialog = await screen.findByRole("dialog", { name: "Stop the invitations not sent yet?" });
    expect(callsTo("POST", "/api/tenancy-imports/7/invitations/cancel")).toHaveLength(0);
    await user.click(within(dialog).getByRole("button", { name: "Stop them" }));
    expect(callsTo("POST", "/api/tenancy-imports/7/invitations/cancel")).toHaveLength(1);
  });

  it("says so when nothing has been imported yet", async () => {
    setup([]);
    expect(await screen.findByText("No tenancy files imported yet")).toBeInTheDocument();
  });
});
