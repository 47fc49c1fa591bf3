import type { z } from "zod";
import type { inspectionResponse } from "../../../src/lib/contracts/inspections.js";
import type { Inspection } from "./inspection.entity.js";

export const toInspectionDto = (i: Inspection): z.input<typeof inspectionResponse> => ({
  id: i.id,
  caseId: i.caseId,
  inspectorUserId: i.inspectorUserId,
  inspectedAt: i.inspectedAt.toISOString(),
  cause: i.cause,
  mouldExtent: i.mouldExtent,
  findings: i.findings,
  roomReadings: i.roomReadings,
  createdAt: i.createdAt.toISOString(),
});
