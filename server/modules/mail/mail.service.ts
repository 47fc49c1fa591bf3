import { randomBytes } from "node:crypto";
import { In, type DataSource, type EntityManager, type FindOptionsWhere } from "typeorm";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, ForbiddenError, NotFoundError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import type { Mailer } from "../../lib/mailer.js";
import { messageLanguage, translator, type MessageLanguage } from "../../lib/i18n.js";
import { inTransaction } from "../../lib/transaction.js";
import { htmlFromText, mailTemplates, SECRET_TEMPLATES, type MailTemplateName, type RenderedMail } from "./mail-templates.js";
import { MailRelay, type MailRelayOptions } from "./mail.relay.js";
import { OutboxEmail, type OutboxStatus } from "./outbox-email.entity.js";

export interface SendMail<T extends MailTemplateName> {
  to: string;
  template: T;
  data: Parameters<(typeof mailTemplates)[T]>[0];
  /**
   * The recipient's language tag (users.preferred_language). Left out, it is looked up by address
   * (RecipientLanguages); staff, and addresses of no one, get English.
   */
  language?: string | null;
  organisationId?: number | null;
  related?: { type: string; id: number };
}

export interface OutboxQuery {
  status?: OutboxStatus;
  page: number;
  pageSize: number;
}

/** An e-mail about a case that staff sent again from the outbox. */
export interface ResentCaseEmail {
  caseId: number;
  outboxId: number;
  to: string;
  template: string;
  subject: string;
  /** The staff member who asked. */
  actorId: number;
}

/**
 * Puts an e-mail sent again on its case's timeline, in the resend's transaction (CaseService, the
 * owner of case events; wired in createServices, as cases depends on mail and not the other way).
 */
export interface CaseEmailTimeline {
  recordEmailResent(m: EntityManager, resent: ResentCaseEmail): Promise<void>;
}

/**
 * The language a recipient reads: a tenant's preferred language by their e-mail address, in the caller's
 * transaction (an account opened in it counts); null for staff and for addresses of no account, so
 * staff e-mails stay English (UserService, wired in createServices).
 */
export interface RecipientLanguages {
  tenantLanguage(m: EntityManager, who: { email: string }): Promise<string | null>;
}

/** The delivery key: fixed once per row, carried by every attempt (see mail.relay.ts). */
const newMessageId = (outboxId: number) => `<outbox-${outboxId}-${randomBytes(9).toString("base64url")}@dewline>`;

/**
 * Renders each e-mail and stores it whole in the outbox, in the caller's transaction; the relay
 * (mail.relay.ts) sends it after the commit. Nothing here talks to the mail server.
 */
export class MailService {
  readonly relay: MailRelay;
  private caseTimeline: CaseEmailTimeline | null = null;
  private languages: RecipientLanguages | null = null;

  constructor(
    private readonly dataSource: DataSource,
    mailer: Mailer,
    logger: Logger,
    private readonly clock: Clock,
    relayOptions: Partial<MailRelayOptions> = {},
  ) {
    this.relay = new MailRelay(dataSource, mailer, logger, clock, relayOptions);
  }

  /** Where a recipient's language is found (UserService); without it every e-mail is English. */
  useRecipientLanguages(languages: RecipientLanguages): void {
    this.languages = languages;
  }

  /** The language an e-mail to `to` is written in. */
  async languageFor(m: EntityManager, to: string, tag?: string | null): Promise<MessageLanguage> {
    if (tag !== undefined) return messageLanguage(tag);
    return messageLanguage(this.languages ? await this.languages.tenantLanguage(m, { email: to }) : null);
  }

  /** Where an e-mail about a case sent again is recorded (CaseService). */
  useCaseTimeline(timeline: CaseEmailTimeline): void {
    this.caseTimeline = timeline;
  }

  /**
   * Records the e-mail, rendered, inside the caller's transaction (so it exists exactly when the
   * record it is about exists), returning a function to call once the transaction has committed: it
   * wakes the relay to send promptly and returns at once (never waiting on the mail server).
   */
  async enqueue<T extends MailTemplateName>(manager: EntityManager, mail: SendMail<T>): Promise<() => Promise<OutboxEmail>> {
    return (await this.enqueueWithId(manager, mail)).deliver;
  }

  /** As enqueue, also telling the outbox row's id (case timelines link to it). */
  async enqueueWithId<T extends MailTemplateName>(
    manager: EntityManager,
    mail: SendMail<T>,
  ): Promise<{ outboxId: number; deliver: () => Promise<OutboxEmail> }> {
    const render = mailTemplates[mail.template] as (d: typeof mail.data, t: ReturnType<typeof translator>) => RenderedMail;
    // Rendered once, in the recipient's language; a retry or resend sends the stored text as it is.
    const rendered = render(mail.data, translator(await this.languageFor(manager, mail.to, mail.language), "mail"));
    const repo = manager.getRepository(OutboxEmail);
    const row = await repo.save(
      repo.create({
        organisationId: mail.organisationId ?? null,
        toAddress: mail.to,
        subject: rendered.subject,
        template: mail.template,
        textBody: rendered.text,
        htmlBody: rendered.html ?? htmlFromText(rendered.text),
        attachments: rendered.attachments?.length ? rendered.attachments : null,
        relatedType: mail.related?.type ?? null,
        relatedId: mail.related?.id ?? null,
        status: "pending",
        attempts: 0,
        nextAttemptAt: this.clock.now(),
      }),
    );
    row.messageId = newMessageId(row.id);
    await repo.update(row.id, { messageId: row.messageId });
    return {
      outboxId: row.id,
      deliver: async () => {
        this.relay.wake();
        return row;
      },
    };
  }

  /** How each outbox row stands now (case timelines show staff each e-mail's delivery). */
  async deliveries(
    ids: readonly number[],
  ): Promise<
    Map<
      number,
      { status: OutboxStatus; to: string; template: string; sentAt: string | null; error: string | null; attempts: number }
    >
  > {
    if (!ids.length) return new Map();
    const rows = await this.dataSource.getRepository(OutboxEmail).findBy({ id: In([...new Set(ids)]) });
    return new Map(
      rows.map((o) => [
        o.id,
        {
          status: o.status,
          to: o.toAddress,
          template: o.template,
          sentAt: o.sentAt?.toISOString() ?? null,
          error: o.error,
          attempts: o.attempts,
        },
      ]),
    );
  }

  /** Queues and wakes the relay in one go (no transaction of the caller's to wait for). */
  async send<T extends MailTemplateName>(mail: SendMail<T>): Promise<OutboxEmail> {
    const deliver = await this.enqueue(this.dataSource.manager, mail);
    return deliver();
  }

  /**
   * Which outbox rows a staff member may see: an admin, every e-mail of their landlord; an officer,
   * those about their landlord's cases (which officers can all open). Nobody else.
   */
  private visibleTo(actor: Actor): FindOptionsWhere<OutboxEmail> {
    if (actor.role === "admin") return { organisationId: actor.organisationId };
    if (actor.role === "officer") return { organisationId: actor.organisationId, relatedType: "case" };
    throw new ForbiddenError();
  }

  /** The landlord's e-mails, newest first, optionally in one state. */
  async list(actor: Actor, q: OutboxQuery): Promise<{ items: OutboxEmail[]; total: number }> {
    const where = { ...this.visibleTo(actor), ...(q.status ? { status: q.status } : {}) };
    const [items, total] = await this.dataSource.getRepository(OutboxEmail).findAndCount({
      where,
      order: { id: "DESC" },
      skip: (q.page - 1) * q.pageSize,
      take: q.pageSize,
    });
    return { items, total };
  }

  /**
   * Sends a sent or failed e-mail again: back to pending with a fresh count of attempts and a new
   * Message-ID (it is a deliberate second copy, not a retry a receiver should drop). One still
   * queued or being sent is refused, and so is one whose single-use link has been forgotten. One
   * about a case goes on the case's timeline in the same transaction.
   */
  async resend(actor: Actor, id: number): Promise<OutboxEmail> {
    const repo = this.dataSource.getRepository(OutboxEmail);
    const row = await repo.findOneBy({ ...this.visibleTo(actor), id });
    if (!row) throw new NotFoundError("No such e-mail.");
    if (row.status === "pending" || row.status === "sending") {
      throw new ConflictError("This e-mail is still queued: it will be sent without being asked again.");
    }
    if (row.textBody === null) {
      throw new ConflictError(
        SECRET_TEMPLATES.has(row.template)
          ? "This e-mail held a single-use link, which is not kept once sent: send a new invitation or reset instead."
          : "This e-mail's message was not kept, so it cannot be sent again.",
      );
    }
    const caseId = row.relatedType === "case" ? row.relatedId : null;
    const timeline = this.caseTimeline;
    if (caseId !== null && !timeline) throw new Error("MailService: no case timeline to record a resend on (useCaseTimeline).");
    const now = this.clock.now();
    await inTransaction(this.dataSource, async (m) => {
      const result = await m.getRepository(OutboxEmail).update(
        { id, status: In(["sent", "failed"]) },
        {
          status: "pending",
          attempts: 0,
          nextAttemptAt: now,
          leaseToken: null,
          leaseExpiresAt: null,
          messageId: newMessageId(id),
          resentAt: now,
          resentByUserId: actor.id,
        },
      );
      if (result.affected !== 1) throw new ConflictError("This e-mail is being sent already.");
      if (caseId !== null) {
        await timeline!.recordEmailResent(m, {
          caseId,
          outboxId: id,
          to: row.toAddress,
          template: row.template,
          subject: row.subject,
          actorId: actor.id,
        });
      }
    });
    this.relay.wake();
    return repo.findOneByOrFail({ id });
  }
}
