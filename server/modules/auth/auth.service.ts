import { IsNull, MoreThan, type DataSource, type EntityManager } from "typeorm";
import type { Config } from "../../config/env.js";
import { ConflictError, ForbiddenError, NotFoundError } from "../../lib/errors.js";
import type { MailService } from "../mail/mail.service.js";
import type { OrganisationService } from "../organisations/organisation.service.js";
import type { PropertyService } from "../properties/property.service.js";
import type { TenancyService } from "../tenancies/tenancy.service.js";
import type { Person, UserService } from "../users/user.service.js";
import type { Actor } from "./actor.js";
import type { InvitationInput } from "./auth.schemas.js";
import { hashPassword, verifyPassword } from "./passwords.js";
import { hashToken, newToken } from "./tokens.js";
import { UserToken, type TokenPurpose } from "./user-token.entity.js";
import type { Clock } from "../../lib/clock.js";
import { roleLabels } from "../../../src/lib/roles.js";

const INVITATION_HOURS = 72;
const RESET_MINUTES = 60;
const INVALID_LINK = "This link is not valid any more: it may have been used already or have expired. Ask for a new one.";

const notWaiting = (status: string) =>
  status === "cancelled"
    ? "This invitation was cancelled. Invite the person again with the form instead."
    : "This person has already accepted their invitation, so there is nothing to send or cancel.";

export const toActor = (u: Person): Actor => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  organisationId: u.organisationId,
});

export class AuthService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly mail: MailService,
    private readonly properties: PropertyService,
    private readonly tenancies: TenancyService,
    private readonly users: UserService,
    private readonly organisations: OrganisationService,
    private readonly clock: Clock,
  ) {}

  /** The active user with these credentials, or null. Never says which half was wrong. */
  async verifyCredentials(email: string, password: string): Promise<Actor | null> {
    const user = await this.users.account({ email: email.trim().toLowerCase() });
    const ok = await verifyPassword(user?.status === "active" ? user.passwordHash : null, password);
    if (!user || !ok) return null;
    await this.users.recordSignIn(user.id, this.clock.now());
    return toActor(user);
  }

  /** Loads the actor behind a session; null when the user is gone or no longer active. */
  async actorById(id: number): Promise<Actor | null> {
    const user = await this.users.account({ id });
    return user && user.status === "active" ? toActor(user) : null;
  }

  /**
   * Admins invite anyone into their organisation; officers invite tenants to a home of theirs.
   * The user, the tenancy, the token, the audit entry and the outbox row are written together. A
   * cancelled invitation's account (same landlord, same address) is invited again rather than refused.
   */
  async invite(actor: Actor, input: InvitationInput): Promise<{ userId: number; expiresAt: Date }> {
    if (actor.role !== "admin" && !(actor.role === "officer" && input.role === "tenant")) {
      throw new ForbiddenError("Only an administrator can invite staff; officers can invite tenants.");
    }
    if (input.role === "tenant") await this.properties.getForStaff(actor, input.propertyId!);
    const { token, hash } = newToken();
    const expiresAt = new Date(this.clock.now().getTime() + INVITATION_HOURS * 3_600_000);
    const { user, deliver } = await this.dataSource.transaction(async (m) => {
      const details = { organisationId: actor.organisationId, email: input.email, name: input.name, role: input.role };
      let user = await this.users.reviveCancelled(m, details);
      if (!user) {
        if (await this.users.emailTaken(input.email, m)) {
          throw new ConflictError("Someone with that e-mail address already has an account.");
        }
        user = await this.users.createInvited(m, details);
      }
      if (input.role === "tenant") {
        await this.tenancies.start(m, {
          propertyId: input.propertyId!,
          tenantUserId: user.id,
          householdNotes: input.householdNotes ?? null,
        });
      }
      await this.users.recordAudit(m, {
        organisationId: actor.organisationId,
        actorId: actor.id,
        targetId: user.id,
        action: "invited",
        to: user.role,
      });
      const deliver = await this.sendInvitation(m, actor, user, hash, token, expiresAt);
      return { user, deliver };
    });
    await deliver();
    return { userId: user.id, expiresAt };
  }

  /**
   * Sends a pending invitation again with a new link (the earlier link stops working). Admins only
   * (the router checks); another landlord's account is not found; an account that is not waiting
   * for its invitation to be accepted is a 409.
   */
  async resendInvitation(actor: Actor, userId: number): Promise<{ userId: number; expiresAt: Date }> {
    const { token, hash } = newToken();
    const expiresAt = new Date(this.clock.now().getTime() + INVITATION_HOURS * 3_600_000);
    const deliver = await this.dataSource.transaction(async (m) => {
      const user = await this.users.lockAccountOf(m, actor.organisationId, userId);
      if (user.status !== "invited") throw new ConflictError(notWaiting(user.status));
      await this.users.recordAudit(m, {
        organisationId: actor.organisationId,
        actorId: actor.id,
        targetId: user.id,
        action: "invitation-resent",
      });
      return this.sendInvitation(m, actor, user, hash, token, expiresAt);
    });
    await deliver();
    return { userId, expiresAt };
  }

  /**
   * Withdraws a pending invitation: its link stops working, the account is marked cancelled (kept, so
   * anything that names it still can), and a tenant's tenancy that the invitation started is removed.
   */
  async cancelInvitation(actor: Actor, userId: number): Promise<void> {
    await this.dataSource.transaction(async (m) => {
      const user = await this.users.lockAccountOf(m, actor.organisationId, userId);
      if (user.status !== "invited") throw new ConflictError(notWaiting(user.status));
      await m
        .getRepository(UserToken)
        .update({ userId: user.id, purpose: "invitation", usedAt: IsNull() }, { usedAt: this.clock.now() });
      await this.users.markCancelled(m, user.id);
      if (user.role === "tenant") await this.tenancies.withdrawUnaccepted(m, user.id);
      await this.users.recordAudit(m, {
        organisationId: actor.organisationId,
        actorId: actor.id,
        targetId: user.id,
        action: "invitation-cancelled",
      });
    });
  }

  /** Stores the new link (replacing any earlier one) and queues the e-mail: staff and tenants get their own wording. */
  private async sendInvitation(m: EntityManager, actor: Actor, user: Person, hash: string, token: string, expiresAt: Date) {
    await this.saveToken(m, user.id, "invitation", hash, expiresAt, actor.id);
    const organisationName = await this.organisations.nameOf(actor.organisationId, m);
    const data = {
      name: user.name,
      organisationName,
      inviterName: actor.name,
      link: `${this.config.appUrl}/invitation/${token}`,
      expiresHours: INVITATION_HOURS,
    };
    const related = { type: "user", id: user.id } as const;
    return user.role === "tenant"
      ? this.mail.enqueue(m, { to: user.email, template: "invitation", organisationId: actor.organisationId, related, data })
      : this.mail.enqueue(m, {
          to: user.email,
          template: "staffInvitation",
          organisationId: actor.organisationId,
          related,
          data: { ...data, roleLabel: roleLabels[user.role] },
        });
  }

  /** Who an invitation link is for, so the page can greet them. */
  async describeInvitation(token: string): Promise<{ email: string; name: string; organisationName: string }> {
    const row = await this.findLiveToken(this.dataSource.manager, token, "invitation");
    const user = await this.users.person(row.userId);
    return { email: user.email, name: user.name, organisationName: await this.organisations.nameOf(user.organisationId) };
  }

  async acceptInvitation(token: string, password: string): Promise<void> {
    const passwordHash = await hashPassword(password);
    await this.dataSource.transaction(async (m) => {
      const row = await this.consumeToken(m, token, "invitation");
      await this.users.setPasswordHash(m, row.userId, passwordHash, true);
      const user = await this.users.person(row.userId, m);
      await this.users.recordAudit(m, {
        organisationId: user.organisationId,
        actorId: user.id,
        targetId: user.id,
        action: "invitation-accepted",
      });
    });
  }

  /** Always succeeds from the caller's point of view, so it cannot be used to find accounts. */
  async requestPasswordReset(email: string): Promise<void> {
    const user = await this.users.account({ email });
    if (!user || user.status !== "active") return;
    const { token, hash } = newToken();
    const deliver = await this.dataSource.transaction(async (m) => {
      await this.saveToken(
        m,
        user.id,
        "password-reset",
        hash,
        new Date(this.clock.now().getTime() + RESET_MINUTES * 60_000),
        null,
      );
      return this.mail.enqueue(m, {
        to: user.email,
        template: "passwordReset",
        organisationId: user.organisationId,
        related: { type: "user", id: user.id },
        data: { name: user.name, link: `${this.config.appUrl}/reset-password/${token}`, expiresMinutes: RESET_MINUTES },
      });
    });
    await deliver();
  }

  async resetPassword(token: string, password: string): Promise<void> {
    const passwordHash = await hashPassword(password);
    await this.dataSource.transaction(async (m) => {
      const row = await this.consumeToken(m, token, "password-reset");
      const user = await this.users.account({ id: row.userId }, m);
      if (!user || user.status !== "active") throw new NotFoundError(INVALID_LINK);
      await this.users.setPasswordHash(m, user.id, passwordHash);
      // Any other reset link still outstanding stops working too.
      await m
        .getRepository(UserToken)
        .update({ userId: user.id, purpose: "password-reset", usedAt: IsNull() }, { usedAt: this.clock.now() });
    });
  }

  private async saveToken(
    m: EntityManager,
    userId: number,
    purpose: TokenPurpose,
    tokenHash: string,
    expiresAt: Date,
    createdById: number | null,
  ) {
    // A new link replaces any earlier one of the same kind.
    await m.getRepository(UserToken).update({ userId, purpose, usedAt: IsNull() }, { usedAt: this.clock.now() });
    await m.getRepository(UserToken).insert({ userId, purpose, tokenHash, expiresAt, createdById, usedAt: null });
  }

  private async findLiveToken(m: EntityManager, token: string, purpose: TokenPurpose, lock = false): Promise<UserToken> {
    const row = await m.getRepository(UserToken).findOne({
      where: { tokenHash: hashToken(token), purpose, usedAt: IsNull(), expiresAt: MoreThan(this.clock.now()) },
      ...(lock ? { lock: { mode: "pessimistic_write" as const } } : {}),
    });
    if (!row) throw new NotFoundError(INVALID_LINK);
    return row;
  }

  /** Marks the token used inside the transaction; a second use (even a concurrent one) finds nothing. */
  private async consumeToken(m: EntityManager, token: string, purpose: TokenPurpose): Promise<UserToken> {
    const row = await this.findLiveToken(m, token, purpose, true);
    await m.getRepository(UserToken).update(row.id, { usedAt: this.clock.now() });
    return row;
  }
}
