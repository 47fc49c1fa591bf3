import { In, type DataSource, type EntityManager } from "typeorm";
import {
  ADMIN_ACTION_KINDS,
  adminActionSubjectOf,
  type AdminActionKind,
  type AdminActionSubject,
} from "../../../src/lib/contracts/integrations.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import type { Person } from "../users/user.service.js";
import { AdminActionEntry } from "./admin-action.entity.js";

export type { AdminActionEntry } from "./admin-action.entity.js";

/** One change to record: what was done, to which key or endpoint, and what it was then (never a secret). */
export interface AdminActionNote {
  action: AdminActionKind;
  subjectId: number;
  detail: string;
}

const LIST_PAGE = 200;

/**
 * The record of what admins changed in the landlord's integrations (API keys, webhook endpoints): the
 * `integration_admin_actions` table's one owner. Each change is recorded by `record(m, …)` in the
 * change's own transaction, so there is no change without its entry and no entry without its change.
 */
export class AdminActionService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly people: { people(ids: readonly number[]): Promise<Map<number, Person>> },
    private readonly clock: Clock,
  ) {}

  async record(m: EntityManager, actor: Actor, note: AdminActionNote): Promise<void> {
    await m.getRepository(AdminActionEntry).insert({
      organisationId: actor.organisationId,
      actorUserId: actor.id,
      action: note.action,
      subjectId: note.subjectId,
      detail: note.detail.slice(0, 500),
      createdAt: this.clock.now(),
    });
  }

  /** Admin: the landlord's latest changes, newest first, all or those about one kind of subject, with who made them. */
  async list(actor: Actor, subject?: AdminActionSubject): Promise<{ entries: AdminActionEntry[]; people: Map<number, Person> }> {
    const entries = await this.dataSource.getRepository(AdminActionEntry).find({
      where: {
        organisationId: actor.organisationId,
        ...(subject ? { action: In(ADMIN_ACTION_KINDS.filter((k) => adminActionSubjectOf(k) === subject)) } : {}),
      },
      order: { id: "DESC" },
      take: LIST_PAGE,
    });
    return { entries, people: await this.people.people([...new Set(entries.map((e) => e.actorUserId))]) };
  }
}
