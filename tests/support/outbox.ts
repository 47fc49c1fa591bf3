// "Was an e-mail sent?" asked of the outbox: every e-mail is written to outbox_emails in the
// request's own transaction, so once the response has arrived the rows are final. Asserting that
// nothing was sent is counting rows here after the request, never waiting and watching the catcher.
import type { DataSource } from "typeorm";
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
