import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { ReadingPartitionService } from "./reading-partitions.service.js";

/** The job's name in logs and its lease (one instance at a time runs it). */
export const READING_PARTITIONS_JOB = "sensor-readings-partitions";
const EVERY_MS = 86_400_000;

/**
 * Keeps next months' partitions of `sensor_readings` in place: at start and then daily (the table holds
 * PARTITION_MONTHS_AHEAD months ahead, so a few missed days cost nothing). Returns a stop function.
 */
export function startReadingPartitionUpkeep(
  partitions: Pick<ReadingPartitionService, "ensureAhead">,
  logger: Logger,
  { everyMs = EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  return leasedJob(READING_PARTITIONS_JOB, {
    leases,
    everyMs,
    logger,
    atStart: true,
    failure: `${READING_PARTITIONS_JOB}: partition upkeep failed`,
    run: () => partitions.ensureAhead(),
  }).stop;
}
