import type { z } from "zod";
import type { complaintResponse } from "../../../src/lib/contracts/complaints.js";
import type { Audience } from "../cases/case.mapper.js";
import type { ComplaintWithClocks } from "./complaint.service.js";

const iso = (d: Date | null) => d?.toISOString() ?? null;

/** A complaint for its reader: the staff note is left out for the tenant; the extension's reason is theirs to see. */
export const toComplaintDto = (
  { complaint: c, clocks, extensionMaxWorkingDays }: ComplaintWithClocks,
  raisedBy: { name: string; role: string } | null,
  audience: Audience,
): z.input<typeof complaintResponse> => {
  const stage = (n: 1 | 2) => {
    const clock = clocks[n - 1]!;
    return {
      stage: n,
      startedAt: iso(n === 1 ? c.raisedAt : c.escalatedAt),
      acknowledgeDueAt: iso(clock.acknowledgeDueAt),
      acknowledgedAt: iso(clock.acknowledgedAt),
      acknowledge: clock.acknowledge,
      respondDueAt: iso(clock.respondDueAt),
      respondedAt: iso(clock.respondedAt),
      respond: clock.respond,
      extensionWorkingDays: clock.extensionWorkingDays,
      extensionReason: n === 1 ? c.stage1ExtensionReason : c.stage2ExtensionReason,
      response: n === 1 ? c.stage1Response : c.stage2Response,
    };
  };
  return {
    id: c.id,
    caseId: c.caseId,
    status: c.status,
    version: c.version,
    raisedAt: c.raisedAt.toISOString(),
    raisedBy,
    onBehalf: c.onBehalf,
    description: c.description,
    escalatedAt: iso(c.escalatedAt),
    escalationReason: c.escalationReason,
    closedAt: iso(c.closedAt),
    stages: [stage(1), stage(2)],
    remedy: {
      apology: c.apology,
      apologyText: c.apologyText,
      putRight: c.putRight,
      compensationOfferedPence: c.compensationOfferedPence,
      compensationOfferedOn: c.compensationOfferedOn,
      compensationAcceptedOn: c.compensationAcceptedOn,
      compensationPaidPence: c.compensationPaidPence,
      compensationPaidOn: c.compensationPaidOn,
    },
    extensionMaxWorkingDays,
    staffNote: audience === "staff" ? c.staffNote : null,
  };
};
