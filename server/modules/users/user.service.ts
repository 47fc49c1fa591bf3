import { Brackets, In, type DataSource, type EntityManager } from "typeorm";
import { keysetAfter, type KeyTerm, type KeysetPage } from "../../lib/table-export.js";
import type { Clock } from "../../lib/clock.js";
import { systemClock } from "../../lib/clock.js";
import { ConflictError, ForbiddenError, NotFoundError } from "../../lib/errors.js";
import { RecentCache } from "../../lib/recent-cache.js";
import { escapeLike } from "../../lib/sql.js";
import type { Actor } from "../../lib/actor.js";
import type { UserAuditAction } from "../../../src/lib/contracts/users.js";
import type { StoredLanguage } from "../../../src/lib/schemas/language.js";
import { UserAuditEntry } from "./user-audit.entity.js";
import { STAFF_ROLES, User, type Role } from "./user.entity.js";
import type { UserListQuery, UserUpdateInput } from "./users.schemas.js";

/** What other modules need to know of a person: enough to name them and write to them. */
export interface Person {
  id: number;
  name: string;
  email: string;
  role: Role;
  organisationId: number;
}

const personOf = (u: User): Person => ({
  id: u.id,
  name: u.name,
  email: u.email,
  role: u.role,
  organisationId: u.organisationId,
});

/** An account as a tenancy import compares it with a file's row. */
export type ImportedContact = Person & Pick<User, "status" | "phone" | "preferredLanguage">;

/** One line of an account's history, with the name of who did it. */
export interface UserAuditRecord {
  id: number;
  action: UserAuditAction;
  actor: { id: number; name: string } | null;
  from: string | null;
  to: string | null;
  at: Date;
}

/** Rows of a tenancy file in one statement: a JSON parameter of well under a megabyte. */
const IMPORT_ROWS_PER_STATEMENT = 5000;

const isStaffRole = (role: Role) => (STAFF_ROLES as readonly Role[]).includes(role);

/** What a signed-in request needs of its account, read on every request (and briefly cached). */
export type SessionAccount = Readonly<Person & Pick<User, "status" | "sessionEpoch" | "preferredLanguage">>;

/**
 * After this process changes an account inside a transaction, its cached copy is not refilled for this
 * long, so a request reading it before the transaction commits cannot put the old account back.
 */
const CHANGED_ACCOUNT_HOLD_OFF_MS = 60_000;

/** The accounts list's order: role, name, then the id to make it total (for keyset pages). */
const USER_SORT: readonly KeyTerm[] = [{ expr: "u.role" }, { expr: "u.name" }, { expr: "u.id" }];

export class UserService {
  /** Accounts behind sessions, for `sessionCacheMs` (server/lib/recent-cache.ts); every change here forgets one. */
  private readonly sessionAccounts: RecentCache<number, SessionAccount>;

  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock = systemClock,
    sessionCacheMs = 0,
    /** Cached copies of sessions (the session store's), forgotten when a user's sessions are ended. */
    private readonly cachedSessions?: { forgetSessionsOf(userId: number, holdOffMs: number): void },
  ) {
    this.sessionAccounts = new RecentCache(sessionCacheMs);
  }

  /**
   * The account behind a signed-in session (any status: the caller checks), or null. Read on every
   * request, so it is cached briefly: this process's own changes are seen at once, another instance's
   * within the cache's lifetime, and a raised session stamp is always exact here.
   */
  async sessionAccount(id: number): Promise<SessionAccount | null> {
    return this.sessionAccounts.get(id, async () => {
      const u = await this.dataSource.getRepository(User).findOne({
        where: { id },
        select: {
          id: true,
          name: true,
          email: true,
          role: true,
          organisationId: true,
          status: true,
          sessionEpoch: true,
          preferredLanguage: true,
        },
      });
      return u
        ? Object.freeze({
            ...personOf(u),
            status: u.status,
            sessionEpoch: u.sessionEpoch,
            preferredLanguage: u.preferredLanguage,
          })
        : null;
    });
  }

  /** Every change to an account goes through here first, so no cached copy outlives it. */
  private changing(id: number): void {
    this.sessionAccounts.forget(id, CHANGED_ACCOUNT_HOLD_OFF_MS);
  }

  /** One person by id, any status (inside the caller's transaction when given one); fails if there is none. */
  async person(id: number, m: EntityManager = this.dataSource.manager): Promise<Person> {
    return personOf(await m.getRepository(User).findOneByOrFail({ id }));
  }

  /**
   * The preferred language of a tenant (users.preferred_language), by id or by e-mail address, in the
   * caller's transaction; null for staff (their e-mails and texts stay English) and for no account.
   * The one way the mail and text services ask (RecipientLanguages, TextLanguages).
   */
  async tenantLanguage(m: EntityManager, who: { id: number } | { email: string }): Promise<string | null> {
    const u = await m.getRepository(User).findOne({ where: who, select: { id: true, role: true, preferredLanguage: true } });
    return u?.role === "tenant" ? u.preferredLanguage : null;
  }

  /** People by id, any status; missing ids are left out. */
  async people(ids: readonly number[], m: EntityManager = this.dataSource.manager): Promise<Map<number, Person>> {
    if (!ids.length) return new Map();
    const rows = await m.getRepository(User).findBy({ id: In([...new Set(ids)]) });
    return new Map(rows.map((u) => [u.id, personOf(u)]));
  }

  /**
   * An active member of the landlord's staff with one of `roles` (any staff role when not given), or
   * null: a tenant, someone disabled or another landlord's staff is not found.
   */
  async findStaff(
    organisationId: number,
    id: number,
    roles: readonly Role[] = ["officer", "maintenance", "admin"],
    m: EntityManager = this.dataSource.manager,
  ): Promise<Person | null> {
    const u = await m.getRepository(User).findOneBy({ id, organisationId, status: "active", role: In([...roles]) });
    return u ? personOf(u) : null;
  }

  // Accounts, for AuthService: sign-in, invitations and password resets.

  /** The account with this e-mail address or id, with its status and password hash (for AuthService only), or null. */
  async account(
    where: { email: string } | { id: number },
    m: EntityManager = this.dataSource.manager,
  ): Promise<(Person & Pick<User, "status" | "passwordHash" | "sessionEpoch">) | null> {
    const u = await m.getRepository(User).findOneBy(where);
    return u ? { ...personOf(u), status: u.status, passwordHash: u.passwordHash, sessionEpoch: u.sessionEpoch } : null;
  }

  /** The landlord whose account uses this address, or null when none does. */
  async organisationOfEmail(email: string, m: EntityManager = this.dataSource.manager): Promise<number | null> {
    const u = await m.getRepository(User).findOne({ where: { email }, select: { id: true, organisationId: true } });
    return u?.organisationId ?? null;
  }

  /** A new account waiting for its invitation to be accepted (no password yet), in the caller's transaction. */
  async createInvited(
    m: EntityManager,
    input: { organisationId: number; email: string; name: string; role: Role },
  ): Promise<Person> {
    const repo = m.getRepository(User);
    return personOf(await repo.save(repo.create({ ...input, status: "invited", passwordHash: null })));
  }

  /** The accounts using these addresses (lower-cased), with their contact details, in the caller's transaction. */
  async contactsByEmail(m: EntityManager, emails: readonly string[]): Promise<Map<string, ImportedContact>> {
    const out = new Map<string, ImportedContact>();
    for (let i = 0; i < emails.length; i += IMPORT_ROWS_PER_STATEMENT) {
      const rows = (await m.query(
        "SELECT u.id, u.name, u.email, u.role, u.organisation_id, u.status, u.phone, u.preferred_language " +
          "FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (email VARCHAR(190) PATH '$')) AS j JOIN users u ON u.email = j.email",
        [JSON.stringify(emails.slice(i, i + IMPORT_ROWS_PER_STATEMENT))],
      )) as {
        id: number;
        name: string;
        email: string;
        role: Role;
        organisation_id: number;
        status: User["status"];
        phone: string | null;
        preferred_language: string | null;
      }[];
      for (const u of rows)
        out.set(u.email, {
          id: Number(u.id),
          name: u.name,
          email: u.email,
          role: u.role,
          organisationId: Number(u.organisation_id),
          status: u.status,
          phone: u.phone,
          preferredLanguage: u.preferred_language,
        });
    }
    return out;
  }

  /**
   * Tenant accounts from a landlord's tenancy file: invited, no password, with their phone and
   * language, in the caller's transaction, a few thousand a statement (one JSON parameter, as the
   * readings import does). Their ids are read back by (landlord, e-mail): insert id ranges are not
   * contiguous under Galera's auto_increment_increment.
   */
  async createImportedTenants(
    m: EntityManager,
    organisationId: number,
    rows: readonly { email: string; name: string; phone: string | null; preferredLanguage: string | null }[],
  ): Promise<Map<string, number>> {
    const out = new Map<string, number>();
    for (let i = 0; i < rows.length; i += IMPORT_ROWS_PER_STATEMENT) {
      const chunk = rows.slice(i, i + IMPORT_ROWS_PER_STATEMENT);
      await m.query(
        "INSERT INTO users (organisation_id, email, name, password_hash, role, status, phone, preferred_language) " +
          "SELECT ?, j.email, j.name, NULL, 'tenant', 'invited', j.phone, j.lang FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (" +
          "ord FOR ORDINALITY, email VARCHAR(190) PATH '$[0]', name VARCHAR(190) PATH '$[1]', phone VARCHAR(40) PATH '$[2]', lang VARCHAR(35) PATH '$[3]'" +
          ")) AS j ORDER BY j.ord",
        [organisationId, JSON.stringify(chunk.map((r) => [r.email, r.name, r.phone, r.preferredLanguage]))],
      );
      const found = (await m.query(
        "SELECT u.id, u.email FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (email VARCHAR(190) PATH '$')) AS j " +
          "JOIN users u ON u.email = j.email WHERE u.organisation_id = ?",
        [JSON.stringify(chunk.map((r) => r.email)), organisationId],
      )) as { id: number | string; email: string }[];
      for (const r of found) out.set(r.email, Number(r.id));
    }
    return out;
  }

  /**
   * Brings accounts of the landlord in line with its tenancy file (each row the account's whole name,
   * phone and language), in the caller's transaction; `revive` also makes a cancelled account invited
   * again, without a password.
   */
  async updateImportedContacts(
    m: EntityManager,
    organisationId: number,
    rows: readonly { id: number; name: string; phone: string | null; preferredLanguage: string | null; revive: boolean }[],
  ): Promise<void> {
    for (let i = 0; i < rows.length; i += IMPORT_ROWS_PER_STATEMENT) {
      const chunk = rows.slice(i, i + IMPORT_ROWS_PER_STATEMENT);
      for (const r of chunk) this.changing(r.id);
      await m.query(
        "UPDATE users u JOIN JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (" +
          "id INT UNSIGNED PATH '$[0]', name VARCHAR(190) PATH '$[1]', phone VARCHAR(40) PATH '$[2]', lang VARCHAR(35) PATH '$[3]', revive TINYINT PATH '$[4]'" +
          ")) AS j ON u.id = j.id " +
          "SET u.name = j.name, u.phone = j.phone, u.preferred_language = j.lang, " +
          "u.password_hash = IF(j.revive = 1 AND u.status = 'cancelled', NULL, u.password_hash), " +
          "u.status = IF(j.revive = 1 AND u.status = 'cancelled', 'invited', u.status) " +
          "WHERE u.organisation_id = ?",
        [JSON.stringify(chunk.map((r) => [r.id, r.name, r.phone, r.preferredLanguage, r.revive ? 1 : 0])), organisationId],
      );
    }
  }

  /** Sets the password hash; `activate` also makes an invited account active. */
  async setPasswordHash(m: EntityManager, id: number, passwordHash: string, activate = false): Promise<void> {
    this.changing(id);
    await m.getRepository(User).update(id, activate ? { passwordHash, status: "active" } : { passwordHash });
  }

  /**
   * Several accounts' preferred languages as stored ("en", "cy", or what a tenancy file said), by id
   * (staff see a tenant's beside their name). A signed-in account's own comes with its cached
   * SessionAccount instead.
   */
  async languagesOf(ids: readonly number[]): Promise<Map<number, string | null>> {
    if (!ids.length) return new Map();
    const rows = await this.dataSource
      .getRepository(User)
      .find({ where: { id: In([...new Set(ids)]) }, select: { id: true, preferredLanguage: true } });
    return new Map(rows.map((u) => [u.id, u.preferredLanguage]));
  }

  /**
   * A tenant chooses the language they read Dewline in (and get e-mails and texts in). Staff screens
   * are English only, so staff have nothing to choose here.
   */
  async setOwnLanguage(actor: Actor, language: StoredLanguage): Promise<string> {
    if (actor.role !== "tenant") throw new ForbiddenError("Only tenants choose a language: staff screens are in English.");
    this.changing(actor.id);
    await this.dataSource.getRepository(User).update({ id: actor.id }, { preferredLanguage: language });
    return language;
  }

  async recordSignIn(id: number, at: Date): Promise<void> {
    await this.dataSource.getRepository(User).update(id, { lastSignInAt: at });
  }

  /** Active officers of any of these landlords, by id. */
  async activeOfficersOf(organisationIds: readonly number[]): Promise<Person[]> {
    if (!organisationIds.length) return [];
    const rows = await this.dataSource
      .getRepository(User)
      .find({ where: { organisationId: In([...organisationIds]), role: "officer", status: "active" }, order: { id: "ASC" } });
    return rows.map(personOf);
  }

  /** Active staff of the landlord with one of `roles`, optionally only among `ids`. */
  async activeStaffOf(
    organisationId: number,
    roles: readonly Role[],
    m: EntityManager = this.dataSource.manager,
    ids?: readonly number[],
  ): Promise<Person[]> {
    if (ids && !ids.length) return [];
    const rows = await m
      .getRepository(User)
      .findBy({ organisationId, status: "active", role: In([...roles]), ...(ids ? { id: In([...ids]) } : {}) });
    return rows.map(personOf);
  }

  /** Active officers, maintenance staff and admins of the actor's landlord, by name. */
  async activeStaff(actor: Actor): Promise<User[]> {
    return this.dataSource.getRepository(User).find({
      where: { organisationId: actor.organisationId, status: "active", role: In(["officer", "maintenance", "admin"]) },
      order: { name: "ASC" },
    });
  }

  /** The accounts list's filters and order on `u`: one definition for the screen's pages and the export's. */
  private filtered(actor: Actor, query: Pick<UserListQuery, "role" | "q">) {
    const qb = this.dataSource
      .getRepository(User)
      .createQueryBuilder("u")
      .where("u.organisation_id = :org", { org: actor.organisationId });
    if (query.role) qb.andWhere("u.role = :role", { role: query.role });
    if (query.q) {
      const like = `%${escapeLike(query.q)}%`;
      qb.andWhere(new Brackets((w) => w.where("u.name LIKE :like", { like }).orWhere("u.email LIKE :like", { like })));
    }
    qb.orderBy();
    for (const term of USER_SORT) qb.addOrderBy(term.expr, "ASC");
    return qb;
  }

  async list(actor: Actor, query: UserListQuery): Promise<{ items: User[]; total: number }> {
    const [items, total] = await this.filtered(actor, query)
      .skip((query.page - 1) * query.pageSize)
      .take(query.pageSize)
      .getManyAndCount();
    return { items, total };
  }

  /** For exports: the next `limit` accounts after the one whose sort values are `after` (a keyset, not an offset). */
  async listAfter(
    actor: Actor,
    query: Pick<UserListQuery, "role" | "q">,
    after: readonly unknown[] | null,
    limit: number,
  ): Promise<KeysetPage<User>> {
    const qb = this.filtered(actor, query).take(limit);
    if (after) {
      const { sql, params } = keysetAfter(USER_SORT, after);
      qb.andWhere(sql, params);
    }
    const rows = await qb.getMany();
    const tail = rows.at(-1);
    return { rows, last: tail ? [tail.role, tail.name, tail.id] : null };
  }

  /**
   * An admin changes a person's name, role or status (active or disabled), in one transaction with
   * an audit entry per change. An admin cannot change their own role or status, and the landlord
   * always keeps at least one active admin. A tenant's account stays a tenant's and staff stay staff.
   * A role change and disabling end the person's sessions at once.
   */
  async update(actor: Actor, id: number, input: UserUpdateInput): Promise<User> {
    return this.dataSource.transaction(async (m) => {
      const repo = m.getRepository(User);
      const user = await repo.findOne({
        where: { id, organisationId: actor.organisationId },
        lock: { mode: "pessimistic_write" },
      });
      if (!user) throw new NotFoundError("No such user.");
      if (user.status === "cancelled") {
        throw new ConflictError("This person's invitation was cancelled. Invite them again to give them an account.");
      }
      const name = input.name !== undefined && input.name !== user.name ? input.name : undefined;
      const role = input.role !== undefined && input.role !== user.role ? input.role : undefined;
      const status = input.status !== undefined && input.status !== user.status ? input.status : undefined;

      if (role !== undefined) {
        if (user.id === actor.id)
          throw new ConflictError("You cannot change your own role. Another administrator can do it for you.");
        if (isStaffRole(role) !== isStaffRole(user.role)) {
          throw new ConflictError(
            user.role === "tenant"
              ? "A tenant's account cannot be given a staff role. Invite the person as staff with another e-mail address."
              : "A staff account cannot be made a tenant's. Invite the tenant with their own e-mail address.",
          );
        }
      }
      if (status !== undefined) {
        if (user.id === actor.id) throw new ConflictError("You cannot disable or enable your own account.");
        if (user.status === "invited") {
          throw new ConflictError("This person has not accepted their invitation yet: send it again or cancel it instead.");
        }
      }
      const stopsBeingAdmin = user.role === "admin" && user.status === "active" && (role !== undefined || status === "disabled");
      if (stopsBeingAdmin) {
        const admins = await repo.find({
          where: { organisationId: actor.organisationId, role: "admin", status: "active" },
          lock: { mode: "pessimistic_write" },
        });
        if (admins.filter((a) => a.id !== user.id).length === 0) {
          throw new ConflictError(
            "This is the only active administrator. Make someone else an administrator first, so the organisation is never left without one.",
          );
        }
      }

      const audit = (action: UserAuditAction, from: string | null, to: string | null) =>
        this.recordAudit(m, { organisationId: actor.organisationId, actorId: actor.id, targetId: user.id, action, from, to });
      if (name !== undefined) {
        await audit("name-changed", user.name, name);
        user.name = name;
      }
      if (role !== undefined) {
        await audit("role-changed", user.role, role);
        user.role = role;
      }
      if (status !== undefined) {
        await audit(status === "disabled" ? "disabled" : "enabled", null, null);
        user.status = status;
      }
      if (name === undefined && role === undefined && status === undefined) return user;
      this.changing(user.id);
      const saved = await repo.save(user);
      if (role !== undefined || status === "disabled") saved.sessionEpoch = await this.endSessions(m, user.id);
      return saved;
    });
  }

  /**
   * Signs the person out everywhere (but `keepSessionId`, when given): their session stamp is raised,
   * so any session issued before (on any app instance, even one whose row is written back later) is
   * refused, and their stored sessions are deleted. Returns the new stamp.
   */
  async endSessions(m: EntityManager, userId: number, keepSessionId?: string): Promise<number> {
    this.changing(userId);
    this.cachedSessions?.forgetSessionsOf(userId, CHANGED_ACCOUNT_HOLD_OFF_MS);
    await m.getRepository(User).increment({ id: userId }, "sessionEpoch", 1);
    await m.query("DELETE FROM `sessions` WHERE JSON_VALUE(`data`, '$.passport.user.id') = ? AND `session_id` <> ?", [
      String(userId),
      keepSessionId ?? "",
    ]);
    const { sessionEpoch } = await m
      .getRepository(User)
      .findOneOrFail({ where: { id: userId }, select: { id: true, sessionEpoch: true } });
    return sessionEpoch;
  }

  /** Writes one line of an account's history, in the caller's transaction. */
  async recordAudit(
    m: EntityManager,
    e: {
      organisationId: number;
      actorId: number;
      targetId: number;
      action: UserAuditAction;
      from?: string | null;
      to?: string | null;
    },
  ): Promise<void> {
    await m.getRepository(UserAuditEntry).insert({
      organisationId: e.organisationId,
      actorUserId: e.actorId,
      targetUserId: e.targetId,
      action: e.action,
      fromValue: e.from ?? null,
      toValue: e.to ?? null,
      createdAt: this.clock.now(),
    });
  }

  /** An account's history, newest first; another landlord's account is not found. */
  async history(actor: Actor, id: number): Promise<UserAuditRecord[]> {
    if (!(await this.dataSource.getRepository(User).existsBy({ id, organisationId: actor.organisationId }))) {
      throw new NotFoundError("No such user.");
    }
    const rows = await this.dataSource
      .getRepository(UserAuditEntry)
      .find({ where: { targetUserId: id, organisationId: actor.organisationId }, order: { id: "DESC" }, take: 200 });
    const actors = await this.people(rows.map((r) => r.actorUserId));
    return rows.map((r) => {
      const who = actors.get(r.actorUserId);
      return {
        id: r.id,
        action: r.action,
        actor: who && who.organisationId === actor.organisationId ? { id: who.id, name: who.name } : null,
        from: r.fromValue,
        to: r.toValue,
        at: r.createdAt,
      };
    });
  }

  // Invitations, for AuthService (which owns the tokens and the e-mail).

  /** The landlord's account with this id, locked for the caller's transaction; another landlord's is not found. */
  async lockAccountOf(m: EntityManager, organisationId: number, id: number): Promise<Person & { status: User["status"] }> {
    const u = await m.getRepository(User).findOne({ where: { id, organisationId }, lock: { mode: "pessimistic_write" } });
    if (!u) throw new NotFoundError("No such user.");
    return { ...personOf(u), status: u.status };
  }

  /** Marks an invited account's invitation as withdrawn. */
  async markCancelled(m: EntityManager, id: number): Promise<void> {
    this.changing(id);
    await m.getRepository(User).update({ id, status: "invited" }, { status: "cancelled" });
  }

  /**
   * The cancelled account of this landlord with this e-mail address, made an invited account again with
   * the new name and role (so the same address can be invited again), or null when there is none.
   */
  async reviveCancelled(
    m: EntityManager,
    input: { organisationId: number; email: string; name: string; role: Role },
  ): Promise<Person | null> {
    const repo = m.getRepository(User);
    const u = await repo.findOne({
      where: { organisationId: input.organisationId, email: input.email, status: "cancelled" },
      lock: { mode: "pessimistic_write" },
    });
    if (!u) return null;
    this.changing(u.id);
    Object.assign(u, { name: input.name, role: input.role, status: "invited", passwordHash: null });
    return personOf(await repo.save(u));
  }
}
