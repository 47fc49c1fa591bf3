import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { BoardReportService } from "./board-report.service.js";

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "board-reports";

const EVERY_MS = 60 * 60_000;

/**
 * Every hour: last month's board report to each landlord's list that has not had it (BoardReportService
 * keeps it to once per landlord and month, across instances and restarts). Returns a stop function,
 * which resolves once a run in progress has finished.
 */
export function startBoardReports(
  reports: Pick<BoardReportService, "sendDue">,
  logger: Logger,
  { everyMs = EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  return leasedJob(JOB_NAME, {
    leases,
    everyMs,
    logger,
    failure: "board reports failed",
    run: () => reports.sendDue(),
  }).stop;
}
