import type { Logger } from "../../lib/logger.js";
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
  let running: Promise<void> | null = null;
  const timer = setInterval(() => {
    if (running) return;
    running = reports
      .sendDue()
      .then(() => undefined)
      .catch((error: unknown) => logger.error({ err: error }, "board reports failed"))
      .finally(() => {
        running = null;
      });
  }, everyMs);
  timer.unref();
  return async () => {
    clearInterval(timer);
    await running;
  };
}
