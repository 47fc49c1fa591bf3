import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { InvitationBatchService } from "./invitation-batch.service.js";

/** Its row in `job_leases`: one instance at a time runs it. */
export const JOB_NAME = "invitation-batches";

/**
 * Every `everyMs` (INVITATION_BATCH_INTERVAL_MS): releases the next batch of queued invitations
 * (at most INVITATIONS_PER_BATCH). Returns a stop function, which resolves once a release in
 * progress has finished.
 */
export function startInvitationBatches(
  batches: Pick<InvitationBatchService, "releaseDue">,
  logger: Logger,
  { everyMs, leases }: LeasedJobOptions & { everyMs: number },
): () => Promise<void> {
  return leasedJob(JOB_NAME, {
    leases,
    everyMs,
    logger,
    failure: "releasing queued invitations failed",
    run: async () => {
      const n = await batches.releaseDue();
      if (n) logger.info({ released: n }, "queued invitations released");
    },
  }).stop;
}
