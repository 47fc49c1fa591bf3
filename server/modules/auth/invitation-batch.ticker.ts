import type { Logger } from "../../lib/logger.js";
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
  let running: Promise<void> | null = null;
  const timer = setInterval(() => {
    if (running) return;
    running = batches
      .releaseDue()
      .then((n) => {
        if (n) logger.info({ released: n }, "queued invitations released");
      })
      .catch((error: unknown) => logger.error({ err: error }, "releasing queued invitations failed"))
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
