import { In, IsNull, type DataSource, type EntityManager } from "typeorm";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError, NotFoundError } from "../../lib/errors.js";
import type { UserService } from "../users/user.service.js";
import type { AuthService } from "./auth.service.js";
import { toActor } from "./auth.service.js";
import { InvitationBatch, PendingInvitation } from "./invitation-batch.entity.js";

/** One invitation to queue: an account of the landlord, or (userId null) an address another landlord's account uses. */
export interface QueuedInvitation {
  userId: number | null;
  email: string;
}

export interface BatchProgress {
  batchId: number;
  total: number;
  sent: number;
  /** Accounts that no longer waited for an invitation when their turn came (cancelled, disabled). */
  skipped: number;
  cancelled: number;
  pending: number;
  state: "sending" | "paused" | "cancelled" | "done";
  /** When the next release is due (null once nothing is pending, or while paused). */
  nextReleaseAt: Date | null;
}

/**
 * Invitations released in throttled batches: an import queues them (persistently, in its own
 * transaction) and the background tick releases at most `perBatch` every `intervalMs`, oldest first,
 * across every landlord. Each release writes the link and the outbox e-mail and marks the row sent in
 * one transaction, so every queued invitation is sent exactly once, across restarts and instances
 * (rows are claimed with SKIP LOCKED).
 */
export class InvitationBatchService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly auth: AuthService,
    private readonly users: UserService,
    private readonly clock: Clock,
    private readonly settings: { perBatch: number; intervalMs: number },
  ) {}

  /** Opens a batch for an import's invitations, in the caller's transaction (`enqueue` fills it). */
  async openBatch(m: EntityManager, actor: Actor): Promise<number> {
    const batch = await m.getRepository(InvitationBatch).save({
      organisationId: actor.organisationId,
      createdById: actor.id,
      createdAt: this.clock.now(),
      lastReleasedAt: null,
      pausedAt: null,
      cancelledAt: null,
    });
    return batch.id;
  }

  /** Queues invitations in the batch, in the order given (the order they go out), in the caller's transaction. */
  async enqueue(m: EntityManager, batchId: number, organisationId: number, items: readonly QueuedInvitation[]): Promise<void> {
    for (let i = 0; i < items.length; i += 5000) {
      await m.query(
        "INSERT INTO pending_invitations (batch_id, organisation_id, user_id, email, status, released_at) " +
          "SELECT ?, ?, j.user_id, j.email, 'pending', NULL FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (" +
          "ord FOR ORDINALITY, user_id INT UNSIGNED PATH '$[0]', email VARCHAR(190) PATH '$[1]')) AS j ORDER BY j.ord",
        [batchId, organisationId, JSON.stringify(items.slice(i, i + 5000).map((x) => [x.userId, x.email]))],
      );
    }
  }

  /** Whether an invitation to this address is already queued or sent by this landlord (so a re-import asks nothing new). */
  async alreadyQueued(m: EntityManager, organisationId: number, emails: readonly string[]): Promise<Set<string>> {
    const out = new Set<string>();
    for (let i = 0; i < emails.length; i += 5000) {
      const rows = (await m.query(
        "SELECT DISTINCT p.email FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (email VARCHAR(190) PATH '$')) AS j " +
          "JOIN pending_invitations p ON p.organisation_id = ? AND p.email = j.email WHERE p.status IN ('pending', 'sent')",
        [JSON.stringify(emails.slice(i, i + 5000)), organisationId],
      )) as { email: string }[];
      for (const r of rows) out.add(r.email);
    }
    return out;
  }

  /**
   * The tick: releases up to `limit` pending invitations of batches that are neither paused nor
   * cancelled, oldest first. Returns how many were released (sent or skipped).
   */
  async releaseDue(limit = this.settings.perBatch): Promise<number> {
    const now = this.clock.now();
    const { deliveries, released } = await this.dataSource.transaction(async (m) => {
      const rows = (await m.query(
        `SELECT p.id, p.batch_id AS batchId, p.user_id AS userId, p.email, b.created_by_id AS createdById, b.organisation_id AS organisationId
           FROM pending_invitations p JOIN invitation_batches b ON b.id = p.batch_id
          WHERE p.status = 'pending' AND b.paused_at IS NULL AND b.cancelled_at IS NULL
          ORDER BY p.id LIMIT ? FOR UPDATE SKIP LOCKED`,
        [limit],
      )) as { id: number; batchId: number; userId: number | null; email: string; createdById: number; organisationId: number }[];
      const inviters = await this.users.people([...new Set(rows.map((r) => r.createdById))], m);
      const deliveries: (() => Promise<unknown>)[] = [];
      const sent: number[] = [];
      const skipped: number[] = [];
      for (const r of rows) {
        const inviter = inviters.get(r.createdById);
        if (r.userId !== null) {
          const account = await this.users.lockAccountOf(m, r.organisationId, r.userId).catch(() => null);
          if (!inviter || !account || account.status !== "invited") {
            skipped.push(r.id);
            continue;
          }
        }
        if (!inviter) {
          skipped.push(r.id);
          continue;
        }
        deliveries.push(await this.auth.releaseQueuedInvitation(m, toActor(inviter), r.userId, r.email));
        sent.push(r.id);
      }
      const repo = m.getRepository(PendingInvitation);
      if (sent.length) await repo.update({ id: In(sent) }, { status: "sent", releasedAt: now });
      if (skipped.length) await repo.update({ id: In(skipped) }, { status: "skipped", releasedAt: now });
      const batchIds = [...new Set(rows.map((r) => r.batchId))];
      if (batchIds.length) await m.getRepository(InvitationBatch).update({ id: In(batchIds) }, { lastReleasedAt: now });
      return { deliveries, released: rows.length };
    });
    for (const d of deliveries) await d();
    return released;
  }

  /** Each batch's progress, for the landlord's own batches only. */
  async progress(organisationId: number, batchIds: readonly number[]): Promise<Map<number, BatchProgress>> {
    const out = new Map<number, BatchProgress>();
    if (batchIds.length === 0) return out;
    const batches = await this.dataSource.getRepository(InvitationBatch).findBy({ id: In(batchIds), organisationId });
    if (batches.length === 0) return out;
    const counts = (await this.dataSource.query(
      `SELECT batch_id AS batchId, status, COUNT(*) AS n FROM pending_invitations WHERE batch_id IN (?) GROUP BY batch_id, status`,
      [batches.map((b) => b.id)],
    )) as { batchId: number; status: string; n: number | string }[];
    for (const b of batches) {
      const n = (status: string) => Number(counts.find((c) => c.batchId === b.id && c.status === status)?.n ?? 0);
      const [sent, skipped, cancelled, pending] = [n("sent"), n("skipped"), n("cancelled"), n("pending")];
      const state = b.cancelledAt ? "cancelled" : pending === 0 ? "done" : b.pausedAt ? "paused" : "sending";
      const next = b.lastReleasedAt ? new Date(b.lastReleasedAt.getTime() + this.settings.intervalMs) : null;
      out.set(b.id, {
        batchId: b.id,
        total: sent + skipped + cancelled + pending,
        sent,
        skipped,
        cancelled,
        pending,
        state,
        // Before the first release the tick picks the batch up within one interval.
        nextReleaseAt: state !== "sending" ? null : (next ?? new Date(b.createdAt.getTime() + this.settings.intervalMs)),
      });
    }
    return out;
  }

  private async lockBatch(m: EntityManager, actor: Actor, batchId: number): Promise<InvitationBatch> {
    const batch = await m
      .getRepository(InvitationBatch)
      .findOne({ where: { id: batchId, organisationId: actor.organisationId }, lock: { mode: "pessimistic_write" } });
    if (!batch) throw new NotFoundError("No such invitation batch.");
    return batch;
  }

  /** Holds the batch's pending invitations until resumed. */
  async pause(actor: Actor, batchId: number): Promise<void> {
    await this.dataSource.transaction(async (m) => {
      const batch = await this.lockBatch(m, actor, batchId);
      if (batch.cancelledAt) throw new ConflictError("This batch was cancelled, so there is nothing to pause.");
      await m.getRepository(InvitationBatch).update({ id: batch.id, pausedAt: IsNull() }, { pausedAt: this.clock.now() });
    });
  }

  async resume(actor: Actor, batchId: number): Promise<void> {
    await this.dataSource.transaction(async (m) => {
      const batch = await this.lockBatch(m, actor, batchId);
      if (batch.cancelledAt) throw new ConflictError("This batch was cancelled; import the file again to invite these people.");
      await m.getRepository(InvitationBatch).update(batch.id, { pausedAt: null });
    });
  }

  /** Withdraws the invitations not sent yet (the accounts stay, invited, for a later invitation). */
  async cancel(actor: Actor, batchId: number): Promise<void> {
    await this.dataSource.transaction(async (m) => {
      const batch = await this.lockBatch(m, actor, batchId);
      if (batch.cancelledAt) return;
      await m.getRepository(InvitationBatch).update(batch.id, { cancelledAt: this.clock.now() });
      await m.getRepository(PendingInvitation).update({ batchId: batch.id, status: "pending" }, { status: "cancelled" });
    });
  }
}
