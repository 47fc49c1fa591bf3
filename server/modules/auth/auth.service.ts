import { IsNull, MoreThan, type DataSource, type EntityManager } from "typeorm";
import type { Config } from "../../config/env.js";
import { AppError, ConflictError, ForbiddenError, NotFoundError, TooManyRequestsError } from "../../lib/errors.js";
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
import type { AfterReply } from "./after-reply.js";
import { emailHash, SignInThrottleService } from "./sign-in-throttle.service.js";

const INVITATION_HOURS = 72;
const RESET_MINUTES = 60;
const UNLOCK_MINUTES = 60;
/** The e-mailed one-time links: the token's kind, its template, the client page it opens, how long it lasts. */
const LINKS = {
  "password-reset": { template: "passwordReset", path: "reset-password", minutes: RESET_MINUTES },
  "sign-in-unlock": { template: "signInUnlock", path: "unlock-sign-in", minutes: UNLOCK_MINUTES },
} as const;
const INVALID_LINK = "This link is not valid any more: it may have been used already or have expired. Ask for a new one.";

const notWaiting = (status: string) =>
  status === "cancelled"
    ? "This invitation was cancelled. Invite the person again with the form instead."
    : "This person has already accepted their invitation, so there is nothing to send or cancel.";

/** The signed-in actor with the session stamp their session is issued with (users.session_epoch). */
export type SessionActor = Actor & { sessionEpoch: number; preferredLanguage?: string | null };

const waitMessage = (seconds: number) => {
  const wait = seconds < 90 ? `${seconds} seconds` : `${Math.ceil(seconds / 60)} minutes`;
  return `There have been several unsuccessful attempts to sign in to this account, so we ask for a short wait between tries. Please wait ${wait} and try again. If this is your account, we have e-mailed you a link that lets you sign in straight away.`;
};

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
    private readonly later: AfterReply,
  ) {
    this.throttle = new SignInThrottleService(dataSource, clock, config.login.maxFailures);
  }

  private readonly throttle: SignInThrottleService;

  /** Resolves once the work started after earlier replies (reset links, unlock links) has finished. */
  settled(): Promise<void> {
    return this.later.settled();
  }

  /**
   * Signs in with an e-mail address and password. After repeated failures for an address (whether
   * or not an account uses it) each try must wait a growing while (429 with Retry-After), checked
   * before the password; `unlocked` (the owner's e-mailed link, opened in this browser) skips the wait.
   * The same work is done whether or not the account exists; e-mail goes out after the reply.
   */
  async signIn(email: string, password: string, unlocked = false): Promise<SessionActor> {
    email = email.trim().toLowerCase();
    if (!unlocked) {
      const wait = await this.throttle.claim(email);
      if (wait !== null)
        throw new TooManyRequestsError(waitMessage(wait), wait).saying(
          wait < 90
            ? { id: "sign-in-wait-seconds", values: { seconds: wait } }
            : { id: "sign-in-wait-minutes", values: { minutes: Math.ceil(wait / 60) } },
        );
    }
    const user = await this.users.account({ email });
    const ok = await verifyPassword(user?.status === "active" ? user.passwordHash : null, password);
    if (!user || !ok) {
      const { notifyOwner } = await this.throttle.failed(email);
      if (notifyOwner) this.later.run("sign-in unlock link", () => this.sendUnlockLink(email));
      throw new AppError(401, "invalid_credentials", "That e-mail address and password do not match an active account.");
    }
    await this.throttle.succeeded(email);
    await this.users.recordSignIn(user.id, this.clock.now());
    return { ...toActor(user), sessionEpoch: user.sessionEpoch };
  }

  /** Loads the actor behind a session; null when the user is gone, no longer active or their sessions were ended since. */
  async actorForSession(id: number, sessionEpoch: number): Promise<SessionActor | null> {
    const user = await this.users.sessionAccount(id);
    return user && user.status === "active" && user.sessionEpoch === sessionEpoch
      ? // The stored language rides along from the cached account: error messages use it without a read.
        { ...toActor(user), sessionEpoch: user.sessionEpoch, preferredLanguage: user.preferredLanguage }
      : null;
  }

  /**
   * The signed-in user's preferred language as stored, for GET /api/auth/me: from the session's cached
   * account, so the lightest signed-in route reads no row for it.
   */
  async languageOf(id: number): Promise<string | null> {
    return (await this.users.sessionAccount(id))?.preferredLanguage ?? null;
  }

  /** Asks for an unlock link by e-mail; the reply never depends on the address (the work happens after it). */
  requestUnlockLink(email: string): void {
    const normalised = email.trim().toLowerCase();
    this.later.run("sign-in unlock link", async () => {
      if (await this.throttle.claimUnlockMail(normalised)) await this.sendUnlockLink(normalised);
    });
  }

  /** Uses an unlock link: the address whose wait this browser may now skip (its hash, as the session keeps it). */
  async useUnlockLink(token: string): Promise<string> {
    return this.dataSource.transaction(async (m) => {
      const row = await this.consumeToken(m, token, "sign-in-unlock");
      const user = await this.users.account({ id: row.userId }, m);
      if (!user || user.status !== "active") throw new NotFoundError(INVALID_LINK);
      return emailHash(user.email);
    });
  }

  private sendUnlockLink(email: string): Promise<void> {
    return this.sendLink(email, "sign-in-unlock");
  }

  /**
   * Admins invite anyone into their organisation; officers invite tenants to a home of theirs.
   * The user, the tenancy, the token, the audit entry and the outbox row are written together. A
   * cancelled invitation's account (same landlord, same address) is invited again rather than refused.
   */
  async invite(actor: Actor, input: InvitationInput): Promise<{ expiresAt: Date }> {
    if (actor.role !== "admin" && !(actor.role === "officer" && input.role === "tenant")) {
      throw new ForbiddenError("Only an administrator can invite staff; officers can invite tenants.");
    }
    if (input.role === "tenant") await this.properties.getForStaff(actor, input.propertyId!);
    const { token, hash } = newToken();
    const expiresAt = new Date(this.clock.now().getTime() + INVITATION_HOURS * 3_600_000);
    const deliver = await this.dataSource.transaction(async (m) => {
      const details = { organisationId: actor.organisationId, email: input.email, name: input.name, role: input.role };
      let user = await this.users.reviveCancelled(m, details);
      if (!user) {
        const holder = await this.users.organisationOfEmail(input.email, m);
        if (holder === actor.organisationId) {
          throw new ConflictError("Someone already uses that address at your organisation: find them under People.");
        }
        // Another landlord's account: the answer must not say so. The address's owner hears of the
        // attempt instead (nothing about the other landlord), and nothing else changes.
        if (holder !== null) return this.tellAddressInUse(m, actor, input.email);
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
      return this.sendInvitation(m, actor, user, hash, token, expiresAt);
    });
    await deliver();
    return { expiresAt };
  }

  private async tellAddressInUse(m: EntityManager, actor: Actor, email: string) {
    const organisationName = await this.organisations.nameOf(actor.organisationId, m);
    return this.mail.enqueue(m, {
      to: email,
      template: "invitationAddressInUse",
      organisationId: actor.organisationId,
      data: { organisationName, inviterName: actor.name },
    });
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

  /**
   * A queued invitation's turn (InvitationBatchService): a new link for the invited account, or for an
   * address another landlord's account uses, the same "already in use" e-mail a single invitation
   * sends. In the caller's transaction; returns the sender to run after commit.
   */
  async releaseQueuedInvitation(m: EntityManager, inviter: Actor, userId: number | null, email: string) {
    if (userId === null) return this.tellAddressInUse(m, inviter, email);
    const { token, hash } = newToken();
    const expiresAt = new Date(this.clock.now().getTime() + INVITATION_HOURS * 3_600_000);
    const user = await this.users.person(userId, m);
    await this.users.recordAudit(m, {
      organisationId: inviter.organisationId,
      actorId: inviter.id,
      targetId: user.id,
      action: "invited",
      to: user.role,
    });
    return this.sendInvitation(m, inviter, user, hash, token, expiresAt);
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

  /**
   * Always succeeds from the caller's point of view, so it cannot be used to find accounts: the
   * reply goes out before anything is looked up, and the link is made and e-mailed after it.
   */
  requestPasswordReset(email: string): void {
    this.later.run("password reset link", () => this.sendResetLink(email));
  }

  private sendResetLink(email: string): Promise<void> {
    return this.sendLink(email, "password-reset");
  }

  /** Makes a one-time link of this kind for an active account and queues its e-mail; nothing for anyone else. */
  private async sendLink(email: string, kind: keyof typeof LINKS): Promise<void> {
    const user = await this.users.account({ email });
    if (!user || user.status !== "active") return;
    const { template, path, minutes } = LINKS[kind];
    const { token, hash } = newToken();
    const deliver = await this.dataSource.transaction(async (m) => {
      await this.saveToken(m, user.id, kind, hash, new Date(this.clock.now().getTime() + minutes * 60_000), null);
      return this.mail.enqueue(m, {
        to: user.email,
        template,
        organisationId: user.organisationId,
        related: { type: "user", id: user.id },
        data: { name: user.name, link: `${this.config.appUrl}/${path}/${token}`, expiresMinutes: minutes },
      });
    });
    await deliver();
  }

  /**
   * Sets the new password and ends every session of the account except `keepSessionId` (the
   * browser making the reset); returns the new session stamp, so that browser can carry it.
   */
  async resetPassword(
    token: string,
    password: string,
    keepSessionId?: string,
  ): Promise<{ userId: number; sessionEpoch: number }> {
    const passwordHash = await hashPassword(password);
    return this.dataSource.transaction(async (m) => {
      const row = await this.consumeToken(m, token, "password-reset");
      const user = await this.users.account({ id: row.userId }, m);
      if (!user || user.status !== "active") throw new NotFoundError(INVALID_LINK);
      await this.users.setPasswordHash(m, user.id, passwordHash);
      // Any other reset link still outstanding stops working too.
      await m
        .getRepository(UserToken)
        .update({ userId: user.id, purpose: "password-reset", usedAt: IsNull() }, { usedAt: this.clock.now() });
      const sessionEpoch = await this.users.endSessions(m, user.id, keepSessionId);
      return { userId: user.id, sessionEpoch };
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
