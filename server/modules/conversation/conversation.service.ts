import type { DataSource, EntityManager } from "typeorm";
import type { MessageKind } from "../../../src/lib/contracts/conversation.js";
import type { StaffMessageInput, TenantMessageInput } from "../../../src/lib/schemas/messages.js";
import type { Config } from "../../config/env.js";
import type { Clock } from "../../lib/clock.js";
import { ValidationError } from "../../lib/errors.js";
import { isStaff, type Actor } from "../auth/actor.js";
import { addressOf, type CaseService } from "../cases/case.service.js";
import type { CaseEventType } from "../cases/case-events.js";
import type { MailService } from "../mail/mail.service.js";
import type { PhotoService } from "../photos/photo.service.js";
import type { UserService } from "../users/user.service.js";
import { CaseReadMark } from "./case-read-mark.entity.js";

/** Each timeline event that is part of the conversation, as the kind of message it is. */
const KIND_OF: Partial<Record<CaseEventType, MessageKind>> = {
  "message-from-tenant": "from-tenant",
  "message-to-tenant": "to-tenant",
  "summary-sent": "summary",
  "internal-note": "internal-note",
};

/** What each side sees of the conversation: internal notes are for staff only. */
const visibleTypes = (staff: boolean): CaseEventType[] =>
  staff
    ? ["message-from-tenant", "message-to-tenant", "summary-sent", "internal-note"]
    : ["message-from-tenant", "message-to-tenant", "summary-sent"];

/** What counts as unread: what the other side wrote (staff do not count each other's notes and messages). */
const incomingTypes = (staff: boolean): CaseEventType[] =>
  staff ? ["message-from-tenant"] : ["message-to-tenant", "summary-sent"];

const placeholders = (n: number) => Array.from({ length: n }, () => "?").join(", ");

export interface ConversationEntry {
  id: number;
  kind: MessageKind;
  at: Date;
  author: { name: string; role: string } | null;
  mine: boolean;
  body: string;
  photoIds: number[];
  readBy: { name: string; role: string; readAt: Date }[];
}

export interface ReadState {
  unread: number;
  readUpTo: number | null;
}

export interface UnreadCase {
  caseId: number;
  reference: string | null;
  unread: number;
  latestAt: Date;
}

/**
 * The conversation on a case between the tenant and the landlord's staff: messages both ways (each
 * a `case_events` row written through CaseService, and an e-mail to the other side), internal notes
 * among staff, and each person's "read up to" mark (the `case_read_marks` table, owned here) for the
 * unread counts and the read receipts staff see.
 */
export class ConversationService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly cases: CaseService,
    private readonly photos: PhotoService,
    private readonly mail: MailService,
    private readonly users: UserService,
    private readonly clock: Clock,
  ) {}

  /** Staff: a message to the tenant (on their case page and e-mailed) or an internal note. Returns the message's id. */
  async postAsStaff(actor: Actor, caseId: number, { body, internal }: StaffMessageInput): Promise<number> {
    const { eventId, deliver, text } = await this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      if (internal) {
        const eventId = await this.cases.recordEventWithId(m, {
          caseId: c.id,
          actorId: actor.id,
          type: "internal-note",
          after: { body },
        });
        return { eventId, deliver: null, text: null };
      }
      let outboxId: number | undefined;
      let deliver: (() => Promise<unknown>) | null = null;
      if (c.tenantUserId !== null) {
        const tenant = await this.users.person(c.tenantUserId, m);
        ({ outboxId, deliver } = await this.mail.enqueueWithId(m, {
          to: tenant.email,
          template: "caseMessage",
          organisationId: c.organisationId,
          related: { type: "case", id: c.id },
          data: { name: tenant.name, reference: c.reference!, senderName: actor.name, body, link: this.link(c.id) },
        }));
      }
      const eventId = await this.cases.recordEventWithId(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "message-to-tenant",
        after: outboxId === undefined ? { body } : { body, outboxId },
      });
      // The text only says there is a message: the message itself stays on the case page.
      const text = await this.cases.queueText(m, c, "landlord-replied", {});
      // Writing a reply means having read what came before it.
      await this.advanceMark(m, c.id, actor.id, eventId);
      return { eventId, deliver, text };
    });
    if (deliver) await deliver();
    if (text) await text();
    return eventId;
  }

  /**
   * A tenant writes to the landlord about their own case, with photos already uploaded to it. The
   * assignee is e-mailed, or every active officer of the landlord while nobody is assigned.
   */
  async postAsTenant(actor: Actor, caseId: number, { body, photoIds }: TenantMessageInput): Promise<number> {
    const wanted = [...new Set(photoIds)];
    if (wanted.length) {
      const onCase = new Set((await this.photos.listForCase(actor, caseId)).map((p) => p.id));
      const strange = wanted.filter((id) => !onCase.has(id));
      if (strange.length)
        throw new ValidationError("photoIds: attach photos of this report.", [
          { field: "photoIds", message: `Photo ${strange.join(", ")} is not part of this report.` },
        ]);
    }
    const { eventId, deliveries } = await this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      const eventId = await this.cases.recordEventWithId(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "message-from-tenant",
        after: { body, photoIds: wanted },
      });
      await this.advanceMark(m, c.id, actor.id, eventId);
      const assignee =
        c.assigneeUserId === null ? null : await this.users.findStaff(c.organisationId, c.assigneeUserId, undefined, m);
      const recipients = assignee ? [assignee] : await this.users.activeStaffOf(c.organisationId, ["officer"], m);
      const deliveries: (() => Promise<unknown>)[] = [];
      for (const to of recipients) {
        deliveries.push(
          await this.cases.queueMail(m, c, {
            to: to.email,
            template: "tenantMessage",
            data: {
              name: to.name,
              reference: c.reference!,
              address: c.property ? addressOf(c.property) : "",
              tenantName: actor.name,
              body,
              photoCount: wanted.length,
              assignedToYou: assignee !== null,
              link: this.link(c.id),
            },
          }),
        );
      }
      return { eventId, deliveries };
    });
    for (const deliver of deliveries) await deliver();
    return eventId;
  }

  /** The conversation as the actor may see it, oldest first, with their unread count and (staff) read receipts. */
  async conversation(actor: Actor, caseId: number): Promise<{ entries: ConversationEntry[] } & ReadState> {
    const staff = isStaff(actor);
    // CaseService.events checks access and already keeps internal notes from tenants.
    const events = (await this.cases.events(actor, caseId)).filter(
      ({ event }) => KIND_OF[event.type as CaseEventType] !== undefined && typeof event.after?.body === "string",
    );
    const marks = await this.dataSource
      .getRepository(CaseReadMark)
      .find({ where: { caseId }, order: { readAt: "ASC", id: "ASC" } });
    const readers = await this.users.people(marks.map((r) => r.userId));
    const myMark = Math.max(0, ...marks.filter((r) => r.userId === actor.id).map((r) => Number(r.upToEventId)));
    const incoming = new Set(incomingTypes(staff));

    const entries = events.map(({ event, actor: author }): ConversationEntry => {
      const id = Number(event.id);
      const kind = KIND_OF[event.type as CaseEventType]!;
      const after = event.after ?? {};
      const photoIds = Array.isArray(after.photoIds) ? after.photoIds.filter((p): p is number => typeof p === "number") : [];
      return {
        id,
        kind,
        at: event.createdAt,
        author,
        mine: event.actorUserId === actor.id,
        body: String(after.body),
        photoIds,
        readBy: staff ? this.readersOf(id, kind, marks, readers) : [],
      };
    });
    const unread = events.filter(({ event }) => incoming.has(event.type as CaseEventType) && Number(event.id) > myMark).length;
    return { entries, unread, readUpTo: myMark || null };
  }

  /** Who of the other side has read a message, with the time each first read up to it or beyond. */
  private readersOf(
    messageId: number,
    kind: MessageKind,
    marks: CaseReadMark[],
    people: Map<number, { name: string; role: string }>,
  ): ConversationEntry["readBy"] {
    if (kind === "internal-note") return [];
    const wantTenant = kind !== "from-tenant";
    const first = new Map<number, Date>();
    for (const mark of marks) {
      const who = people.get(mark.userId);
      if (!who || (who.role === "tenant") !== wantTenant || Number(mark.upToEventId) < messageId) continue;
      const seen = first.get(mark.userId);
      if (!seen || mark.readAt < seen) first.set(mark.userId, mark.readAt);
    }
    return [...first].map(([userId, readAt]) => ({ name: people.get(userId)!.name, role: people.get(userId)!.role, readAt }));
  }

  /**
   * Marks the conversation read up to `upTo` (the newest message the person was shown), or up to the
   * newest message they may see. A mark never moves back.
   */
  async markRead(actor: Actor, caseId: number, upTo?: number): Promise<ReadState> {
    await this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      const types = visibleTypes(isStaff(actor));
      const [row] = (await m.query(
        `SELECT MAX(id) AS id FROM case_events WHERE case_id = ? AND type IN (${placeholders(types.length)})${upTo ? " AND id <= ?" : ""}`,
        [c.id, ...types, ...(upTo ? [upTo] : [])],
      )) as { id: string | number | null }[];
      if (row?.id != null) await this.advanceMark(m, c.id, actor.id, Number(row.id));
    });
    const { unread, readUpTo } = await this.conversation(actor, caseId);
    return { unread, readUpTo };
  }

  /**
   * The cases with messages from the other side the actor has not read, newest first: a tenant's own
   * cases at the homes they live in today (as CaseService.listForTenant); for staff, the cases assigned to them and those nobody is assigned to (whose tenants'
   * messages are e-mailed to every officer).
   */
  async unreadCases(actor: Actor, limit = 100): Promise<UnreadCase[]> {
    const staff = isStaff(actor);
    const types = incomingTypes(staff);
    // A tenant counts only the cases they can open: their own, at the homes they live in today.
    const own = staff ? [] : (await this.cases.listForTenant(actor)).map((c) => c.id);
    if (!staff && own.length === 0) return [];
    const scope = staff
      ? {
          sql: "c.organisation_id = ? AND (c.assignee_user_id = ? OR c.assignee_user_id IS NULL)",
          params: [actor.organisationId, actor.id],
        }
      : { sql: `c.id IN (${placeholders(own.length)})`, params: own };
    // cases and case_events belong to the cases module; this only reads them, joined by table name in one query.
    const rows = (await this.dataSource.query(
      `SELECT e.case_id AS caseId, c.reference AS reference, COUNT(*) AS unread, MAX(e.created_at) AS latestAt
         FROM cases c
         JOIN case_events e ON e.case_id = c.id AND e.type IN (${placeholders(types.length)})
         LEFT JOIN (SELECT case_id, MAX(up_to_event_id) AS up_to FROM case_read_marks WHERE user_id = ? GROUP BY case_id) r
           ON r.case_id = c.id
        WHERE ${scope.sql} AND e.id > COALESCE(r.up_to, 0)
        GROUP BY e.case_id, c.reference
        ORDER BY latestAt DESC, caseId DESC
        LIMIT ${Math.max(1, Math.floor(limit))}`,
      [...types, actor.id, ...scope.params],
    )) as { caseId: number; reference: string | null; unread: string | number; latestAt: Date | string }[];
    return rows.map((r) => ({
      caseId: Number(r.caseId),
      reference: r.reference,
      unread: Number(r.unread),
      latestAt: new Date(r.latestAt),
    }));
  }

  /** Moves a person's mark on a case forward to `eventId` (never back), in the caller's transaction. */
  private async advanceMark(m: EntityManager, caseId: number, userId: number, eventId: number): Promise<void> {
    const [current] = (await m.query(
      "SELECT MAX(up_to_event_id) AS upTo FROM case_read_marks WHERE case_id = ? AND user_id = ?",
      [caseId, userId],
    )) as { upTo: string | number | null }[];
    if (current?.upTo != null && Number(current.upTo) >= eventId) return;
    await m
      .createQueryBuilder()
      .insert()
      .into(CaseReadMark)
      .values({ caseId, userId, upToEventId: String(eventId), readAt: this.clock.now() })
      .orIgnore()
      .execute();
  }

  private link(caseId: number) {
    return `${this.config.appUrl}/cases/${caseId}`;
  }
}
