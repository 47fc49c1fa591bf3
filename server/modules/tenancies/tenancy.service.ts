import { IsNull, LessThanOrEqual, MoreThanOrEqual, type DataSource, type EntityManager } from "typeorm";
import type { Clock } from "../../lib/clock.js";
import { NotFoundError } from "../../lib/errors.js";
import type { Actor } from "../../lib/actor.js";
import type { Property, PropertyService } from "../properties/property.service.js";
import { Tenancy } from "./tenancy.entity.js";

export class TenancyService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly properties: PropertyService,
    private readonly clock: Clock,
  ) {}

  /** Today's date (UTC), against which tenancies' start and end dates are read. */
  private today(): string {
    return this.clock.now().toISOString().slice(0, 10);
  }

  /** Starts a tenancy today (inside the caller's transaction). */
  async start(
    m: EntityManager,
    t: { propertyId: number; tenantUserId: number; householdNotes: string | null; startDate?: string },
  ) {
    return m
      .getRepository(Tenancy)
      .save(m.getRepository(Tenancy).create({ ...t, startDate: t.startDate ?? this.today(), endDate: null }));
  }

  /**
   * Removes the tenancies an invitation started for someone who never accepted it (their invitation
   * was cancelled), inside the caller's transaction, so the home has no phantom tenant.
   */
  async withdrawUnaccepted(m: EntityManager, tenantUserId: number): Promise<void> {
    await m.getRepository(Tenancy).delete({ tenantUserId });
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

  /** The tenant living at the home now (the latest current tenancy), or null. */
  async currentTenantOf(propertyId: number, m: EntityManager = this.dataSource.manager): Promise<number | null> {
    const d = this.today();
    const row = await m
      .getRepository(Tenancy)
      .createQueryBuilder("t")
      .where("t.property_id = :propertyId AND t.start_date <= :today AND (t.end_date IS NULL OR t.end_date >= :today)", {
        propertyId,
        today: d,
      })
      .orderBy("t.start_date", "DESC")
      .getOne();
    return row?.tenantUserId ?? null;
  }

  /** Whether the tenant has ever had a tenancy of the home. */
  async hasLivedAt(tenantUserId: number, propertyId: number): Promise<boolean> {
    return this.dataSource.getRepository(Tenancy).existsBy({ tenantUserId, propertyId });
  }

  /** The household notes of the tenant's latest tenancy of the home, or null. */
  async householdNotes(
    propertyId: number,
    tenantUserId: number,
    m: EntityManager = this.dataSource.manager,
  ): Promise<string | null> {
    const t = await m.getRepository(Tenancy).findOne({ where: { propertyId, tenantUserId }, order: { startDate: "DESC" } });
    return t?.householdNotes ?? null;
  }

  /** The home a tenant lives in now, with its rooms. */
  async homeOf(actor: Actor): Promise<{ tenancy: Tenancy; property: Property }> {
    const tenancy = await this.currentFor(actor);
    if (!tenancy) throw new NotFoundError("We could not find a current tenancy for your account. Please contact your landlord.");
    const property = await this.properties.homeWithRooms(tenancy.propertyId);
    return { tenancy, property };
  }

  /** Every tenancy of a home, with whether it runs today: current ones first, then the latest to start. */
  async ofHome(propertyId: number): Promise<(Tenancy & { current: boolean })[]> {
    const d = this.today();
    const rows = await this.dataSource
      .getRepository(Tenancy)
      .find({ where: { propertyId }, order: { startDate: "DESC", id: "DESC" }, take: 100 });
    return rows
      .map((t) => Object.assign(t, { current: t.startDate <= d && (t.endDate === null || t.endDate >= d) }))
      .sort((a, b) => Number(b.current) - Number(a.current));
  }
}
