import { Brackets, In, type DataSource } from "typeorm";
import { ConflictError, NotFoundError } from "../../lib/errors.js";
import { escapeLike } from "../../lib/sql.js";
import type { Actor } from "../auth/actor.js";
import { User } from "./user.entity.js";
import type { UserListQuery } from "./users.schemas.js";

export class UserService {
  constructor(private readonly dataSource: DataSource) {}

  /** Active officers, maintenance staff and admins of the actor's landlord, by name. */
  async activeStaff(actor: Actor): Promise<User[]> {
    return this.dataSource.getRepository(User).find({
      where: { organisationId: actor.organisationId, status: "active", role: In(["officer", "maintenance", "admin"]) },
      order: { name: "ASC" },
    });
  }

  async list(actor: Actor, query: UserListQuery): Promise<{ items: User[]; total: number }> {
    const qb = this.dataSource.getRepository(User).createQueryBuilder("u").where("u.organisation_id = :org", { org: actor.organisationId });
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
