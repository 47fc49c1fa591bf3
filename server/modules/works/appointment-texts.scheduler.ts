import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { WorkOrderService } from "./work-order.service.js";

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "appointment-text-reminders";

const EVERY_MS = 15 * 60_000;

/**
 * Every 15 minutes (and at start): a text the day before each appointment, to tenants with texts on.
 * Each booking's reminder is queued once only, however often this runs. Returns a stop function.
 */
export function startAppointmentTextReminders(
  works: Pick<WorkOrderService, "textDueReminders">,
  logger: Logger,
  { everyMs = EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  return leasedJob(JOB_NAME, {
    leases,
    everyMs,
    logger,
    atStart: true,
    failure: "appointment text reminders failed",
    run: () => works.textDueReminders(),
  }).stop;
}
