import { randomUUID } from "node:crypto";
import { In, type DataSource, type EntityManager } from "typeorm";
import type { AdminActionKind } from "../../../src/lib/contracts/integrations.js";
import { WEBHOOK_TEST_EVENT, type WebhookEventType, type WebhookPayload } from "../../../src/lib/contracts/webhooks.js";
import type { WebhookEndpointPatch } from "../../../src/lib/schemas/webhooks.js";
import type { Config } from "../../config/env.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, NotFoundError, ValidationError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { inTransaction } from "../../lib/transaction.js";
import type { Actor } from "../auth/actor.js";
import type { CaseEventListener, CaseEventNotice, NoticedCaseEvent } from "../cases/case-event-listener.js";
import { WebhookAttempt } from "./webhook-attempt.entity.js";
import { WebhookDelivery } from "./webhook-delivery.entity.js";
import { WebhookEndpoint } from "./webhook-endpoint.entity.js";
import { type WebhookEvent } from "./webhook-event.entity.js";
import { caseEventBody, webhookTypeOf } from "./webhook-payload.js";
import { newSigningSecret } from "./webhook-signature.js";
import { endpointUrlProblem } from "./webhook-url.js";
import { WebhookRelay, type WebhookRelayOptions } from "./webhook.relay.js";
import type { WebhookEndpointCreate } from "./webhooks.schemas.js";

/** After a rotation the old secret still signs (as a second v1=) for this long, so receivers can switch over. */
export const PREVIOUS_SECRET_GRACE_MS = 24 * 3_600_000;

/**
 * Where an admin's change to an endpoint is recorded, inside the change's transaction (wired to the
 * integrations module's record of admin actions; this module imports nothing of it).
 */
export interface AdminActionRecorder {
  record(
    m: EntityManager,
    actor: Actor,
    note: { action: Extract<AdminActionKind, `webhook-${string}`>; subjectId: number; detail: string },
  ): Promise<void>;
}

export interface EndpointCounts {
  pending: number;
  failed: number;
}

export interface DeliveryWithHistory {
  delivery: WebhookDelivery;
  event: WebhookEvent;
  attempts: WebhookAttempt[];
}

/**
 * Webhooks: a landlord's admins register endpoints; case events (heard through CaseService's
 * CaseEventListener, in the change's own transaction) become events with one delivery per subscribed
 * endpoint; the relay sends them. The webhook tables' one owner.
 */
export class WebhookService implements CaseEventListener {
  readonly relay: WebhookRelay;

  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Pick<Config, "env" | "appUrl">,
    logger: Logger,
    private readonly clock: Clock,
    private readonly adminActions: AdminActionRecorder,
    relayOptions: Partial<WebhookRelayOptions> = {},
  ) {
    this.relay = new WebhookRelay(dataSource, logger, clock, relayOptions);
  }

  // ---- the case events -------------------------------------------------------------------------

  wants(type: NoticedCaseEvent["type"]): boolean {
    return webhookTypeOf(type) !== null;
  }

  /**
   * In the change's transaction: one event row and a delivery for each active endpoint of the case's
   * landlord that chose this type. Nothing is written when nobody listens, except a missed deadline,
   * whose row is the mark that keeps it to one event per case and stage.
   */
  async caseEventRecorded(m: EntityManager, notice: CaseEventNotice): Promise<void> {
    const type = webhookTypeOf(notice.event.type);
    if (!type) return;
    const organisationId = notice.case.organisationId;
    const endpoints = (await m.getRepository(WebhookEndpoint).find({ where: { organisationId, active: true } })).filter((e) =>
      e.eventTypes.includes(type),
    );
    const dedupeKey =
      notice.event.type === "deadline-missed" ? `deadline-missed:${notice.case.id}:${notice.event.after.stage}` : null;
    if (!endpoints.length && dedupeKey === null) return;
    const uid = randomUUID();
    const body = caseEventBody(uid, notice, this.config.appUrl);
    if (!body) return;
    const eventId = await this.insertEvent(m, {
      uid,
      organisationId,
      type,
      caseId: notice.case.id,
      caseReference: notice.case.reference,
      dedupeKey,
      body,
      occurredAt: notice.occurredAt,
    });
    if (eventId === null) return;
    await this.queue(
      m,
      eventId,
      organisationId,
      endpoints.map((e) => e.id),
      notice.occurredAt,
    );
  }

  /** INSERT IGNORE: null when an event with the same dedupe key is already there. */
  private async insertEvent(
    m: EntityManager,
    e: Omit<WebhookEvent, "id" | "body"> & { body: WebhookPayload },
  ): Promise<number | null> {
    const result = (await m.query(
      "INSERT IGNORE INTO webhook_events (uid, organisation_id, type, case_id, case_reference, dedupe_key, body, occurred_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?)",
      [e.uid, e.organisationId, e.type, e.caseId, e.caseReference, e.dedupeKey, JSON.stringify(e.body), e.occurredAt],
    )) as { affectedRows: number; insertId: number | bigint };
    return result.affectedRows === 1 ? Number(result.insertId) : null;
  }

  private async queue(m: EntityManager, eventId: number, organisationId: number, endpointIds: number[], due: Date) {
    if (!endpointIds.length) return;
    await m.getRepository(WebhookDelivery).insert(
      endpointIds.map((endpointId) => ({
        eventId,
        endpointId,
        organisationId,
        status: "pending" as const,
        nextAttemptAt: due,
      })),
    );
  }

  // ---- endpoints -------------------------------------------------------------------------------

  private checkUrl(url: string): void {
    const problem = endpointUrlProblem(url, this.config.env === "production");
    if (problem) throw new ValidationError(`url: ${problem}`, [{ field: "url", message: problem }]);
  }

  /** The landlord's endpoint, or 404 (another landlord's is never revealed). */
  private async endpointOf(actor: Actor, id: number, m: EntityManager = this.dataSource.manager): Promise<WebhookEndpoint> {
    const endpoint = await m.getRepository(WebhookEndpoint).findOneBy({ id, organisationId: actor.organisationId });
    if (!endpoint) throw new NotFoundError("No such webhook endpoint.");
    return endpoint;
  }

  async list(actor: Actor): Promise<{ endpoint: WebhookEndpoint; counts: EndpointCounts }[]> {
    const endpoints = await this.dataSource
      .getRepository(WebhookEndpoint)
      .find({ where: { organisationId: actor.organisationId }, order: { id: "ASC" } });
    const counts = await this.countsOf(endpoints.map((e) => e.id));
    return endpoints.map((endpoint) => ({ endpoint, counts: counts.get(endpoint.id) ?? { pending: 0, failed: 0 } }));
  }

  async countsOf(endpointIds: number[]): Promise<Map<number, EndpointCounts>> {
    const out = new Map<number, EndpointCounts>();
    if (!endpointIds.length) return out;
    const rows = (await this.dataSource
      .getRepository(WebhookDelivery)
      .createQueryBuilder("d")
      .select("d.endpoint_id", "endpointId")
      .addSelect("SUM(d.status IN ('pending', 'sending'))", "pending")
      .addSelect("SUM(d.status = 'failed')", "failed")
      .where("d.endpoint_id IN (:...ids)", { ids: endpointIds })
      .groupBy("d.endpoint_id")
      .getRawMany()) as { endpointId: number; pending: string | number; failed: string | number }[];
    for (const r of rows) out.set(Number(r.endpointId), { pending: Number(r.pending), failed: Number(r.failed) });
    return out;
  }

  async get(actor: Actor, id: number): Promise<{ endpoint: WebhookEndpoint; counts: EndpointCounts }> {
    const endpoint = await this.endpointOf(actor, id);
    return { endpoint, counts: (await this.countsOf([id])).get(id) ?? { pending: 0, failed: 0 } };
  }

  /** A new endpoint with its own signing secret, answered this once; recorded with who added it. */
  async create(actor: Actor, input: WebhookEndpointCreate): Promise<{ endpoint: WebhookEndpoint; secret: string }> {
    this.checkUrl(input.url);
    const secret = newSigningSecret();
    const id = await inTransaction(this.dataSource, async (m) => {
      const repo = m.getRepository(WebhookEndpoint);
      const saved = await repo.save(
        repo.create({
          organisationId: actor.organisationId,
          url: input.url,
          description: input.description,
          eventTypes: input.eventTypes,
          secret,
          active: true,
          createdByUserId: actor.id,
          createdAt: this.clock.now(),
        }),
      );
      await this.adminActions.record(m, actor, {
        action: "webhook-created",
        subjectId: saved.id,
        detail: `${saved.url}, events: ${saved.eventTypes.join(", ")}`,
      });
      return saved.id;
    });
    return { endpoint: await this.endpointOf(actor, id), secret };
  }

  /** Changes what the patch names; a change is recorded with the fields it changed (nothing when nothing changed). */
  async update(actor: Actor, id: number, patch: WebhookEndpointPatch): Promise<WebhookEndpoint> {
    if (patch.url !== undefined) this.checkUrl(patch.url);
    await inTransaction(this.dataSource, async (m) => {
      const endpoint = await m
        .getRepository(WebhookEndpoint)
        .findOne({ where: { id, organisationId: actor.organisationId }, lock: { mode: "pessimistic_write" } });
      if (!endpoint) throw new NotFoundError("No such webhook endpoint.");
      const changes: Partial<WebhookEndpoint> = {};
      const said: string[] = [];
      if (patch.url !== undefined && patch.url !== endpoint.url) {
        changes.url = patch.url;
        said.push(`address ${endpoint.url} → ${patch.url}`);
      }
      if (patch.description !== undefined && patch.description !== endpoint.description) {
        changes.description = patch.description;
        said.push("description");
      }
      if (patch.eventTypes !== undefined && patch.eventTypes.join() !== endpoint.eventTypes.join()) {
        changes.eventTypes = patch.eventTypes as WebhookEventType[];
        said.push(`events: ${patch.eventTypes.join(", ")}`);
      }
      if (patch.active !== undefined && patch.active !== endpoint.active) {
        changes.active = patch.active;
        said.push(patch.active ? "switched on" : "switched off");
      }
      if (!said.length) return;
      await m.getRepository(WebhookEndpoint).update(endpoint.id, changes);
      await this.adminActions.record(m, actor, {
        action: "webhook-changed",
        subjectId: endpoint.id,
        detail: `${endpoint.url}: ${said.join("; ")}`,
      });
    });
    return this.endpointOf(actor, id);
  }

  /** Removes the endpoint with its deliveries and their attempts; the record of it stays. */
  async remove(actor: Actor, id: number): Promise<void> {
    await inTransaction(this.dataSource, async (m) => {
      const endpoint = await this.endpointOf(actor, id, m);
      await m.getRepository(WebhookEndpoint).delete(endpoint.id);
      await this.adminActions.record(m, actor, { action: "webhook-removed", subjectId: endpoint.id, detail: endpoint.url });
    });
  }

  /** A new secret; the old one still signs for PREVIOUS_SECRET_GRACE_MS (a second v1=), then no more. */
  async rotateSecret(actor: Actor, id: number): Promise<{ endpoint: WebhookEndpoint; secret: string }> {
    const secret = newSigningSecret();
    const now = this.clock.now();
    await inTransaction(this.dataSource, async (m) => {
      const endpoint = await m
        .getRepository(WebhookEndpoint)
        .findOne({ where: { id, organisationId: actor.organisationId }, lock: { mode: "pessimistic_write" } });
      if (!endpoint) throw new NotFoundError("No such webhook endpoint.");
      await m.getRepository(WebhookEndpoint).update(id, {
        secret,
        previousSecret: endpoint.secret,
        previousSecretUntil: new Date(now.getTime() + PREVIOUS_SECRET_GRACE_MS),
        secretRotatedAt: now,
      });
      await this.adminActions.record(m, actor, {
        action: "webhook-secret-replaced",
        subjectId: id,
        detail: `${endpoint.url} (the old secret signs too for 24 hours)`,
      });
    });
    return { endpoint: await this.endpointOf(actor, id), secret };
  }

  // ---- deliveries ------------------------------------------------------------------------------

  /** The endpoint's deliveries, newest first, each with every attempt (newest first). */
  async deliveries(
    actor: Actor,
    endpointId: number,
    { page, pageSize }: { page: number; pageSize: number },
  ): Promise<{ items: DeliveryWithHistory[]; total: number }> {
    await this.endpointOf(actor, endpointId);
    const [rows, total] = await this.dataSource.getRepository(WebhookDelivery).findAndCount({
      where: { endpointId },
      relations: { event: true },
      order: { id: "DESC" },
      skip: (page - 1) * pageSize,
      take: pageSize,
    });
    const attempts = rows.length
      ? await this.dataSource
          .getRepository(WebhookAttempt)
          .find({ where: { deliveryId: In(rows.map((r) => r.id)) }, order: { id: "DESC" } })
      : [];
    return {
      items: rows.map((delivery) => ({
        delivery,
        event: delivery.event!,
        attempts: attempts.filter((a) => a.deliveryId === delivery.id),
      })),
      total,
    };
  }

  private async deliveryWithHistory(id: number): Promise<DeliveryWithHistory> {
    const delivery = await this.dataSource
      .getRepository(WebhookDelivery)
      .findOneOrFail({ where: { id }, relations: { event: true } });
    const attempts = await this.dataSource
      .getRepository(WebhookAttempt)
      .find({ where: { deliveryId: id }, order: { id: "DESC" } });
    return { delivery, event: delivery.event!, attempts };
  }

  /** "Send again": the delivery is due now with a fresh count of attempts (the same event id, so receivers can tell). */
  async resend(actor: Actor, endpointId: number, deliveryId: number): Promise<DeliveryWithHistory> {
    await this.endpointOf(actor, endpointId);
    const now = this.clock.now();
    const result = await this.dataSource.getRepository(WebhookDelivery).update(
      { id: deliveryId, endpointId, status: In(["pending", "delivered", "failed"]) },
      {
        status: "pending",
        attempts: 0,
        nextAttemptAt: now,
        leaseToken: null,
        leaseExpiresAt: null,
        resentAt: now,
        resentByUserId: actor.id,
      },
    );
    if (result.affected !== 1) {
      const exists = await this.dataSource.getRepository(WebhookDelivery).existsBy({ id: deliveryId, endpointId });
      if (!exists) throw new NotFoundError("No such delivery.");
      throw new ConflictError("This delivery is being sent right now.");
    }
    const answer = await this.deliveryWithHistory(deliveryId);
    this.relay.wake();
    return answer;
  }

  /** A test event to this one endpoint (whatever it subscribed to), so an admin can check the receiving side. */
  async sendTest(actor: Actor, endpointId: number): Promise<DeliveryWithHistory> {
    const endpoint = await this.endpointOf(actor, endpointId);
    const now = this.clock.now();
    const uid = randomUUID();
    const deliveryId = await inTransaction(this.dataSource, async (m) => {
      const eventId = await this.insertEvent(m, {
        uid,
        organisationId: actor.organisationId,
        type: WEBHOOK_TEST_EVENT,
        caseId: null,
        caseReference: null,
        dedupeKey: null,
        body: {
          id: uid,
          type: WEBHOOK_TEST_EVENT,
          occurredAt: now.toISOString(),
          landlord: { id: actor.organisationId },
          case: null,
          data: { message: "A test event from Dewline: if its signature checks out, this endpoint is ready." },
        },
        occurredAt: now,
      });
      await this.queue(m, eventId!, actor.organisationId, [endpoint.id], now);
      const row = await m.getRepository(WebhookDelivery).findOneByOrFail({ eventId: eventId!, endpointId: endpoint.id });
      return row.id;
    });
    const answer = await this.deliveryWithHistory(deliveryId);
    this.relay.wake();
    return answer;
  }
}
