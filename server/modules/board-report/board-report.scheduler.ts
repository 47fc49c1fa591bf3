import type { Logger } from "../../lib/logger.js";
import { startRepeatingJob } from "../../lib/repeating-job.js";
import type { BoardReportService } from "./board-report.service.js";

const EVERY_MS = 60 * 60_000;

/**
 * Every hour: last month's board report to each landlord's list that has not had it (BoardReportService
 * keeps it to once per landlord and month, across instances and restarts). Returns a stop function,
 * which resolves once a run in progress has finished.
 */
export function startBoardReports(
  reports: Pick<BoardReportService, "sendDue">,
  logger: Logger,
  { everyMs = EVERY_MS }: { everyMs?: number } = {},
): () => Promise<void> {
  return startRepeatingJob({ everyMs, logger, failure: "board reports failed", run: () => reports.sendDue() });
}
