import { Brackets, type DataSource } from "typeorm";
import { NotFoundError } from "../../lib/errors.js";
import { escapeLike } from "../../lib/sql.js";
import type { Actor } from "../../lib/actor.js";
import type { PropertyListQuery } from "./properties.schemas.js";
import { Property } from "./property.entity.js";

/** The records other modules receive from this service (they never query the entities themselves). */
export type { Property } from "./property.entity.js";
export type { Room } from "./room.entity.js";

export class PropertyService {
  constructor(private readonly dataSource: DataSource) {}

  /** Staff only (the route checks the role): homes of the actor's organisation. */
  async list(actor: Actor, query: PropertyListQuery): Promise<{ items: Property[]; total: number }> {
    const qb = this.dataSource
      .getRepository(Property)
      .createQueryBuilder("p")
      .where("p.organisation_id = :org", { org: actor.organisationId });
    if (query.estate) qb.andWhere("p.estate = :estate", { estate: query.estate });
    if (query.q) {
      const like = `%${escapeLike(query.q)}%`;
      const compactPostcode = `%${escapeLike(query.q.replace(/\s+/g, "").toUpperCase())}%`;
      qb.andWhere(
        new Brackets((w) =>
          w
            .where("p.address_line1 LIKE :like", { like })
            .orWhere("p.address_line2 LIKE :like", { like })
            .orWhere("p.town LIKE :like", { like })
            .orWhere("REPLACE(p.postcode, ' ', '') LIKE :pc", { pc: compactPostcode })
            .orWhere("p.uprn = :exact", { exact: query.q }),
        ),
      );
    }
    const [items, total] = await qb
      .orderBy("p.estate", "ASC")
      .addOrderBy("p.address_line1", "ASC")
      .addOrderBy("p.id", "ASC")
      .skip((query.page - 1) * query.pageSize)
      .take(query.pageSize)
      .getManyAndCount();
    return { items, total };
  }

  /** A home of the actor's organisation with its rooms; 404 for anything else, so other landlords' homes stay invisible. */
  async getForStaff(actor: Actor, id: number): Promise<Property> {
    const property = await this.dataSource
      .getRepository(Property)
      .findOne({ where: { id, organisationId: actor.organisationId }, relations: { rooms: true } });
    if (!property) throw new NotFoundError("No such home.");
    return property;
  }

  /** The tenant's home with its rooms (TenancyService has decided it is theirs). */
  async homeWithRooms(id: number): Promise<Property> {
    return this.dataSource.getRepository(Property).findOneOrFail({ where: { id }, relations: { rooms: true } });
  }

  async estates(actor: Actor): Promise<string[]> {
    const rows: { estate: string }[] = await this.dataSource
      .getRepository(Property)
      .createQueryBuilder("p")
      .select("DISTINCT p.estate", "estate")
      .where("p.organisation_id = :org", { org: actor.organisationId })
      .orderBy("estate", "ASC")
      .getRawMany();
    return rows.map((r) => r.estate);
  }
}
