import type { DataSource, EntityManager } from "typeorm";
import { Organisation } from "./organisation.entity.js";

/** Landlords. Other modules ask here for a landlord's name rather than reading the table. */
export class OrganisationService {
  constructor(private readonly dataSource: DataSource) {}

  /** The landlord's name (inside the caller's transaction when given one). */
  async nameOf(id: number, m: EntityManager = this.dataSource.manager): Promise<string> {
    return (await m.getRepository(Organisation).findOneByOrFail({ id })).name;
  }
}
