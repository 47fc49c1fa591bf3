import { IsNull, LessThanOrEqual, MoreThanOrEqual, type DataSource, type EntityManager } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { NotFoundError } from "../../lib/errors.js";
import type { Actor } from "../auth/actor.js";
import { Property } from "../properties/property.entity.js";
import { Tenancy } from "./tenancy.entity.js";

export class TenancyService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly clock: Clock,
  ) {}

  /** Today's date (UTC), against which tenancies' start and end dates are read. */
  private today(): string {
    return this.clock.now().toISOString().slice(0, 10);
  }

  /** Starts a tenancy today (inside the caller's transaction). */
  async start(m: EntityManager, t: { propertyId: number; tenantUserId: number; householdNotes: string | null; startDate?: string }) {
    return m.getRepository(Tenancy).save(
      m.getRepository(Tenancy).create({ ...t, startDate: t.startDate ?? this.today(), endDate: null }),
    );
  }

  /** The tenant's current tenancy (started, not ended), or null. The one place a tenant's home is decided. */
  async currentFor(actor: Actor): Promise<Tenancy | null> {
    const repo = this.dataSource.getRepository(Tenancy);
    const d = this.today();
    return repo.findOne({
      where: [
        { tenantUserId: actor.id, startDate: LessThanOrEqual(d), endDate: IsNull() },
        { tenantUserId: actor.id, startDate: LessThanOrEqual(d), endDate: MoreThanOrEqual(d) },
      ],
      order: { startDate: "DESC" },
    });
  }

  /** The home a tenant lives in now, with its rooms. */
  async homeOf(actor: Actor): Promise<{ tenancy: Tenancy; property: Property }> {
    const tenancy = await this.currentFor(actor);
    if (!tenancy) throw new NotFoundError("We could not find a current tenancy for your account. Please contact your landlord.");
    const property = await this.dataSource
      .getRepository(Property)
      .findOneOrFail({ where: { id: tenancy.propertyId }, relations: { rooms: true } });
    return { tenancy, property };
  }
}
