import { QueryClientProvider } from "@tanstack/react-query";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import type { ReactNode } from "react";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import type { ComplaintResponse, ComplaintStageResponse } from "@/lib/contracts";
import { createQueryClient } from "@/lib/query-client";
import { StaffComplaintPanel } from "@/features/complaints/components/staff-complaint-panel";
import { TenantComplaintSection } from "@/features/complaints/components/tenant-complaint-section";
import { mockApi } from "./support/api-mock";

const notStarted: ComplaintStageResponse = {
  stage: 2,
  startedAt: null,
  acknowledgeDueAt: null,
  acknowledgedAt: null,
  acknowledge: "not-started",
  respondDueAt: null,
  respondedAt: null,
  respond: "not-started",
  extensionWorkingDays: null,
  extensionReason: null,
  response: null,
};

function complaint(over: Partial<ComplaintResponse> = {}, stage1: Partial<ComplaintStageResponse> = {}): ComplaintResponse {
  return {
    id: 7,
    caseId: 42,
    status: "stage-1-received",
    version: 1,
    raisedAt: "2026-12-21T10:00:00.000Z",
    raisedBy: { name: "Robin Ashdown", role: "tenant" },
    onBehalf: false,
    description: "Nobody came to look at the mould for three weeks.",
    escalatedAt: null,
    escalationReason: null,
    closedAt: null,
    stages: [
      {
        stage: 1,
        startedAt: "2026-12-21T10:00:00.000Z",
        acknowledgeDueAt: "2026-12-30T23:59:59.999Z",
        acknowledgedAt: null,
        acknowledge: "pending",
        respondDueAt: "2027-01-14T23:59:59.999Z",
        respondedAt: null,
        respond: "pending",
        extensionWorkingDays: null,
        extensionReason: null,
        response: null,
        ...stage1,
      },
      notStarted,
    ],
    remedy: {
      apology: false,
      apologyText: null,
      putRight: null,
      compensationOfferedPence: null,
      compensationOfferedOn: null,
      compensationAcceptedOn: null,
      compensationPaidPence: null,
      compensationPaidOn: null,
    },
    extensionMaxWorkingDays: 10,
    staffNote: null,
    ...over,
  };
}

function renderWith(ui: ReactNode) {
  return render(<QueryClientProvider client={createQueryClient()}>{ui}</QueryClientProvider>);
}

describe("the tenant's complaint", () => {
  beforeEach(() => clearCsrfToken());

  it("shows when to expect the response and why it was extended", async () => {
    mockApi({
      "GET /api/cases/42/complaints": {
        body: {
          complaints: [
            complaint(
              { status: "stage-1-acknowledged", version: 3 },
              {
                acknowledgedAt: "2026-12-30T15:00:00.000Z",
                acknowledge: "met",
                respondDueAt: "2027-01-28T23:59:59.999Z",
                extensionWorkingDays: 10,
                extensionReason: "We are waiting for the roofer's report.",
              },
            ),
          ],
        },
      },
    });
    renderWith(<TenantComplaintSection caseId={42} />);
    expect(await screen.findByText("Stage 1: acknowledged, response due")).toBeInTheDocument();
    expect(screen.getByText("Extended by 10 working days: We are waiting for the roofer's report.")).toBeInTheDocument();
    const clocks = screen.getByRole("list", { name: "Complaint clocks" });
    expect(within(clocks).getByText("Thursday 28 January 2027")).toBeInTheDocument();
    expect(within(clocks).getByText("In time")).toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Take my complaint to stage 2" })).not.toBeInTheDocument();
  });

  it("takes it to stage 2 with the tenant's reason and the version shown", async () => {
    const api = mockApi({
      "GET /api/cases/42/complaints": {
        body: { complaints: [complaint({ status: "stage-1-responded", version: 5 }, { response: "We are sorry." })] },
      },
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "POST /api/complaints/7/escalate": { body: complaint({ status: "stage-2-received", version: 6 }) },
    });
    renderWith(<TenantComplaintSection caseId={42} />);
    const user = userEvent.setup();
    await user.type(await screen.findByRole("textbox", { name: /Still unhappy/ }), "The ceiling is still black.");
    await user.click(screen.getByRole("button", { name: "Take my complaint to stage 2" }));
    await waitFor(() => expect(api.callsTo("POST", "/api/complaints/7/escalate")).toHaveLength(1));
    expect(api.callsTo("POST", "/api/complaints/7/escalate")[0]!.body).toEqual({
      version: 5,
      reason: "The ceiling is still black.",
    });
  });
});

describe("the staff complaint panel", () => {
  beforeEach(() => clearCsrfToken());

  it("acknowledges the stage with the version shown", async () => {
    const api = mockApi({
      "GET /api/cases/42/complaints": { body: { complaints: [complaint()] } },
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "POST /api/complaints/7/acknowledge": { body: complaint({ status: "stage-1-acknowledged", version: 2 }) },
    });
    renderWith(<StaffComplaintPanel caseId={42} canAct />);
    await userEvent.setup().click(await screen.findByRole("button", { name: "Acknowledge stage 1 and send the letter" }));
    await waitFor(() => expect(api.callsTo("POST", "/api/complaints/7/acknowledge")).toHaveLength(1));
    expect(api.callsTo("POST", "/api/complaints/7/acknowledge")[0]!.body).toEqual({ version: 1, note: null });
  });
});
