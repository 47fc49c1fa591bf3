import type { Logger } from "../../lib/logger.js";
import { startRepeatingJob } from "../../lib/repeating-job.js";
import type { InvitationBatchService } from "./invitation-batch.service.js";

/**
 * Every `everyMs` (INVITATION_BATCH_INTERVAL_MS): releases the next batch of queued invitations
 * (at most INVITATIONS_PER_BATCH). Returns a stop function, which resolves once a release in
 * progress has finished.
 */
export function startInvitationBatches(
  batches: Pick<InvitationBatchService, "releaseDue">,
  logger: Logger,
  { everyMs }: { everyMs: number },
): () => Promise<void> {
  return startRepeatingJob({
    everyMs,
    logger,
    failure: "releasing queued invitations failed",
    run: async () => {
      const n = await batches.releaseDue();
      if (n) logger.info({ released: n }, "queued invitations released");
    },
  });
}
