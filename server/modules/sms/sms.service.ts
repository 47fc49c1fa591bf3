import { In, type DataSource, type EntityManager } from "typeorm";
import { normaliseUkMobile, ukMobileProblem } from "../../../src/lib/domain/uk-mobile.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { ForbiddenError, ValidationError } from "../../lib/errors.js";
import { messageLanguage } from "../../lib/i18n.js";
import type { LeasedQueueOptions } from "../../lib/leased-queue.js";
import type { Logger } from "../../lib/logger.js";
import { OutboxSms, type SmsStatus } from "./outbox-sms.entity.js";
import type { SmsProvider } from "./sms-provider.js";
import { SmsPreference } from "./sms-preference.entity.js";
import { renderSms, type SmsKind, type SmsTexts } from "./sms-texts.js";
import { SmsRelay } from "./sms.relay.js";

export interface TextChoice {
  mobileNumber: string | null;
  textsOn: boolean;
}

export interface QueueText<K extends SmsKind> {
  organisationId: number;
  userId: number;
  kind: K;
  data: SmsTexts[K];
  related?: { type: string; id: number };
  /** Queue it once only for this key (a second try with the same key queues nothing). */
  onceKey?: string;
}

/** What queueing came to: the text's outbox row, or why none was queued. */
export type QueuedText =
  | { queued: true; outboxSmsId: number; body: string; numberEnding: string; deliver: () => void }
  | { queued: false; reason: "texts-off" | "already-queued" };

/** A tenant's language (users.preferred_language) by id, in the caller's transaction (UserService). */
export interface TextLanguages {
  tenantLanguage(m: EntityManager, who: { id: number }): Promise<string | null>;
}

/** The last three digits, which is all a timeline shows of a number. */
const endingOf = (n: string) => n.slice(-3);

/**
 * Text messages to tenants: each tenant's number and on/off choice, and the text outbox. Texts are
 * queued in the caller's transaction (so a text exists exactly when the change it is about exists)
 * and sent by the relay after the commit. Nothing here waits on the provider.
 */
export class SmsService {
  readonly relay: SmsRelay;
  private languages: TextLanguages | null = null;

  constructor(
    private readonly dataSource: DataSource,
    provider: SmsProvider,
    logger: Logger,
    private readonly clock: Clock,
    relayOptions: Partial<LeasedQueueOptions> = {},
  ) {
    this.relay = new SmsRelay(dataSource, provider, logger, clock, relayOptions);
  }

  /** Where a tenant's language is found (UserService); without it every text is English. */
  useRecipientLanguages(languages: TextLanguages): void {
    this.languages = languages;
  }

  /** The tenant's choice (no row: no number, texts off). */
  async choiceOf(userId: number, m: EntityManager = this.dataSource.manager): Promise<TextChoice> {
    const row = await m.getRepository(SmsPreference).findOneBy({ userId });
    return { mobileNumber: row?.mobileNumber ?? null, textsOn: row?.textsOn ?? false };
  }

  /** The tenants' choices, for staff lists (missing: texts off). */
  async choicesOf(userIds: readonly number[]): Promise<Map<number, TextChoice>> {
    if (!userIds.length) return new Map();
    const rows = await this.dataSource.getRepository(SmsPreference).findBy({ userId: In([...new Set(userIds)]) });
    return new Map(rows.map((r) => [r.userId, { mobileNumber: r.mobileNumber, textsOn: r.textsOn }]));
  }

  /** A tenant sets their own number and turns texts on or off. Texts on needs a UK mobile number. */
  async setOwnChoice(actor: Actor, input: { mobileNumber: string | null; textsOn: boolean }): Promise<TextChoice> {
    if (actor.role !== "tenant") throw new ForbiddenError();
    const typed = input.mobileNumber?.trim() || null;
    if (typed !== null) {
      const problem = ukMobileProblem(typed);
      if (problem) throw new ValidationError(`mobileNumber: ${problem}`, [{ field: "mobileNumber", message: problem }]);
    }
    if (input.textsOn && typed === null) {
      const message = "Enter your mobile number to get texts.";
      throw new ValidationError(`mobileNumber: ${message}`, [{ field: "mobileNumber", message }]);
    }
    const repo = this.dataSource.getRepository(SmsPreference);
    const now = this.clock.now();
    const before = await repo.findOneBy({ userId: actor.id });
    const mobileNumber = typed === null ? null : normaliseUkMobile(typed);
    await repo.save({
      userId: actor.id,
      mobileNumber,
      textsOn: input.textsOn,
      optedInAt: input.textsOn && !before?.textsOn ? now : (before?.optedInAt ?? null),
      optedOutAt: !input.textsOn && before?.textsOn ? now : (before?.optedOutAt ?? null),
      updatedAt: now,
    });
    return { mobileNumber, textsOn: input.textsOn };
  }

  /**
   * Queues a text to a tenant in the caller's transaction, if they have texts on; returns what it
   * came to, with a function to call once the transaction has committed (it wakes the relay).
   */
  async enqueue<K extends SmsKind>(m: EntityManager, text: QueueText<K>): Promise<QueuedText> {
    const choice = await this.choiceOf(text.userId, m);
    if (!choice.textsOn || !choice.mobileNumber) return { queued: false, reason: "texts-off" };
    // Rendered once, in the tenant's language; the outbox keeps the words, so a retry sends the same text.
    const language = messageLanguage(this.languages ? await this.languages.tenantLanguage(m, { id: text.userId }) : null);
    const body = renderSms(text.kind, text.data, language);
    const repo = m.getRepository(OutboxSms);
    if (text.onceKey && (await repo.existsBy({ onceKey: text.onceKey }))) return { queued: false, reason: "already-queued" };
    const row = await repo.save(
      repo.create({
        organisationId: text.organisationId,
        userId: text.userId,
        toNumber: choice.mobileNumber,
        kind: text.kind,
        body,
        relatedType: text.related?.type ?? null,
        relatedId: text.related?.id ?? null,
        onceKey: text.onceKey ?? null,
        status: "pending",
        attempts: 0,
        nextAttemptAt: this.clock.now(),
      }),
    );
    return {
      queued: true,
      outboxSmsId: row.id,
      body,
      numberEnding: endingOf(choice.mobileNumber),
      deliver: () => this.relay.wake(),
    };
  }

  /** How each text stands now (case timelines show staff each text's delivery). */
  async deliveries(
    ids: readonly number[],
  ): Promise<
    Map<number, { status: SmsStatus; sentAt: string | null; error: string | null; attempts: number; providerId: string | null }>
  > {
    if (!ids.length) return new Map();
    const rows = await this.dataSource.getRepository(OutboxSms).findBy({ id: In([...new Set(ids)]) });
    return new Map(
      rows.map((r) => [
        r.id,
        {
          status: r.status,
          sentAt: r.sentAt?.toISOString() ?? null,
          error: r.error,
          attempts: r.attempts,
          providerId: r.providerId,
        },
      ]),
    );
  }

  /** The landlord's texts, newest first (staff only). */
  async list(
    actor: Actor,
    q: { status?: SmsStatus; page: number; pageSize: number },
  ): Promise<{ items: OutboxSms[]; total: number }> {
    if (actor.role !== "admin" && actor.role !== "officer") throw new ForbiddenError();
    const [items, total] = await this.dataSource.getRepository(OutboxSms).findAndCount({
      where: { organisationId: actor.organisationId, ...(q.status ? { status: q.status } : {}) },
      order: { id: "DESC" },
      skip: (q.page - 1) * q.pageSize,
      take: q.pageSize,
    });
    return { items, total };
  }
}
