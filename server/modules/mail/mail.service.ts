import { In, type DataSource, type EntityManager } from "typeorm";
import type { Logger } from "../../lib/logger.js";
import type { Mailer } from "../../lib/mailer.js";
import { mailTemplates, type MailTemplateName, type RenderedMail } from "./mail-templates.js";
import { OutboxEmail, type OutboxStatus } from "./outbox-email.entity.js";
import type { Clock } from "../../lib/clock.js";

export interface SendMail<T extends MailTemplateName> {
  to: string;
  template: T;
  data: Parameters<(typeof mailTemplates)[T]>[0];
  organisationId?: number | null;
  related?: { type: string; id: number };
}

/** Renders, records in the outbox, then sends. A failed send is recorded, never thrown at the caller. */
export class MailService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly mailer: Mailer,
    private readonly logger: Logger,
    private readonly clock: Clock,
  ) {}

  /**
   * Records the e-mail as pending inside the caller's transaction (so it exists exactly when the
   * record it is about exists), returning a function that sends it once the transaction has committed.
   */
  async enqueue<T extends MailTemplateName>(manager: EntityManager, mail: SendMail<T>): Promise<() => Promise<OutboxEmail>> {
    return (await this.enqueueWithId(manager, mail)).deliver;
  }

  /** As enqueue, also telling the outbox row's id (case timelines link to it). */
  async enqueueWithId<T extends MailTemplateName>(
    manager: EntityManager,
    mail: SendMail<T>,
  ): Promise<{ outboxId: number; deliver: () => Promise<OutboxEmail> }> {
    const render = mailTemplates[mail.template] as (d: typeof mail.data) => RenderedMail;
    const rendered = render(mail.data);
    const row = await manager.getRepository(OutboxEmail).save(
      manager.getRepository(OutboxEmail).create({
        organisationId: mail.organisationId ?? null,
        toAddress: mail.to,
        subject: rendered.subject,
        template: mail.template,
        relatedType: mail.related?.type ?? null,
        relatedId: mail.related?.id ?? null,
        status: "pending",
      }),
    );
    return { outboxId: row.id, deliver: () => this.deliver(row, rendered) };
  }

  /** How each outbox row stands now (case timelines show staff each e-mail's delivery). */
  async deliveries(
    ids: readonly number[],
  ): Promise<Map<number, { status: OutboxStatus; to: string; template: string; sentAt: string | null; error: string | null }>> {
    if (!ids.length) return new Map();
    const rows = await this.dataSource.getRepository(OutboxEmail).findBy({ id: In([...new Set(ids)]) });
    return new Map(
      rows.map((o) => [
        o.id,
        { status: o.status, to: o.toAddress, template: o.template, sentAt: o.sentAt?.toISOString() ?? null, error: o.error },
      ]),
    );
  }

  async send<T extends MailTemplateName>(mail: SendMail<T>): Promise<OutboxEmail> {
    const deliver = await this.enqueue(this.dataSource.manager, mail);
    return deliver();
  }

  private async deliver(row: OutboxEmail, { text, attachments }: RenderedMail): Promise<OutboxEmail> {
    const repo = this.dataSource.getRepository(OutboxEmail);
    try {
      const { messageId } = await this.mailer.send({ to: row.toAddress, subject: row.subject, text, attachments });
      Object.assign(row, { status: "sent", messageId, sentAt: this.clock.now(), error: null });
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      this.logger.warn({ outboxId: row.id, err: message }, "e-mail could not be sent");
      Object.assign(row, { status: "failed", error: message.slice(0, 2000) });
    }
    await repo.update(row.id, { status: row.status, messageId: row.messageId, sentAt: row.sentAt, error: row.error });
    return row;
  }
}
