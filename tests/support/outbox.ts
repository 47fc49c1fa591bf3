// "Was an e-mail sent?" asked of the outbox: every e-mail is written to outbox_emails in the
// request's own transaction, so once the response has arrived the rows exist. Asserting that
// nothing was sent is counting rows here after the request, never waiting and watching the catcher.
// Sending is the relay's job and happens after the response: `mailSettled` waits until the relay
// has sent (or failed to send) everything due, before a test reads the catcher or a row's status.
import type { DataSource } from "typeorm";
import type { AppContext } from "../../server/app-context.js";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";

export interface OutboxFilter {
  to: string;
  template?: string;
  caseId?: number;
}

/** The outbox rows to one address (optionally of one template, about one case), oldest first. */
export function outboxRows(ds: DataSource, f: OutboxFilter): Promise<OutboxEmail[]> {
  return ds.getRepository(OutboxEmail).find({
    where: {
      toAddress: f.to,
      ...(f.template === undefined ? {} : { template: f.template }),
      ...(f.caseId === undefined ? {} : { relatedType: "case", relatedId: f.caseId }),
    },
    order: { id: "ASC" },
  });
}

export async function outboxCount(ds: DataSource, f: OutboxFilter): Promise<number> {
  return (await outboxRows(ds, f)).length;
}

/** Resolves once the app's relay has no send in flight and nothing due is left (its state, not a time). */
export async function mailSettled(t: { ctx: Pick<AppContext, "services"> }): Promise<void> {
  // Reset and unlock links are queued after the reply (so its timing tells nothing): wait for that first.
  await t.ctx.services.auth.settled();
  return t.ctx.services.mail.relay.idle();
}
