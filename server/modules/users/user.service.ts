import { Brackets, In, type DataSource, type EntityManager } from "typeorm";
import { ConflictError, NotFoundError } from "../../lib/errors.js";
import { escapeLike } from "../../lib/sql.js";
import type { Actor } from "../../lib/actor.js";
import { User, type Role } from "./user.entity.js";
import type { UserListQuery } from "./users.schemas.js";

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

export class UserService {
  constructor(private readonly dataSource: DataSource) {}

  /** One person by id, any status (inside the caller's transaction when given one); fails if there is none. */
  async person(id: number, m: EntityManager = this.dataSource.manager): Promise<Person> {
    return personOf(await m.getRepository(User).findOneByOrFail({ id }));
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
  ): Promise<(Person & Pick<User, "status" | "passwordHash">) | null> {
    const u = await m.getRepository(User).findOneBy(where);
    return u ? { ...personOf(u), status: u.status, passwordHash: u.passwordHash } : null;
  }

  async emailTaken(email: string, m: EntityManager = this.dataSource.manager): Promise<boolean> {
    return m.getRepository(User).existsBy({ email });
  }

  /** A new account waiting for its invitation to be accepted (no password yet), in the caller's transaction. */
  async createInvited(
    m: EntityManager,
    input: { organisationId: number; email: string; name: string; role: Role },
  ): Promise<Person> {
    const repo = m.getRepository(User);
    return personOf(await repo.save(repo.create({ ...input, status: "invited", passwordHash: null })));
  }

  /** Sets the password hash; `activate` also makes an invited account active. */
  async setPasswordHash(m: EntityManager, id: number, passwordHash: string, activate = false): Promise<void> {
    await m.getRepository(User).update(id, activate ? { passwordHash, status: "active" } : { passwordHash });
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

  async list(actor: Actor, query: UserListQuery): Promise<{ items: User[]; total: number }> {
    const qb = this.dataSource
      .getRepository(User)
      .createQueryBuilder("u")
      .where("u.organisation_id = :org", { org: actor.organisationId });
    if (query.role) qb.andWhere("u.role = :role", { role: query.role });
    if (query.q) {
      const like = `%${escapeLike(query.q)}%`;
      qb.andWhere(new Brackets((w) => w.where("u.name LIKE :like", { like }).orWhere("u.email LIKE :like", { like })));
    }
    const [items, total] = await qb
      .orderBy("u.role", "ASC")
      .addOrderBy("u.name", "ASC")
      .addOrderBy("u.id", "ASC")
      .skip((query.page - 1) * query.pageSize)
      .take(query.pageSize)
      .getManyAndCount();
    return { items, total };
  }

  async setStatus(actor: Actor, id: number, status: "active" | "disabled"): Promise<User> {
    const repo = this.dataSource.getRepository(User);
    const user = await repo.findOneBy({ id, organisationId: actor.organisationId });
    if (!user) throw new NotFoundError("No such user.");
    if (user.id === actor.id) throw new ConflictError("You cannot change your own account's status.");
    if (user.status === "invited") throw new ConflictError("This person has not accepted their invitation yet.");
    user.status = status;
    return repo.save(user);
  }
}
