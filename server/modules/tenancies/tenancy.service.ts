import { IsNull, LessThanOrEqual, MoreThanOrEqual, type DataSource, type EntityManager } from "typeorm";
import { localDate } from "../../../src/lib/domain/working-days.js";
import type { Clock } from "../../lib/clock.js";
import { NotFoundError } from "../../lib/errors.js";
import type { Actor } from "../../lib/actor.js";
import type { Property, PropertyService } from "../properties/property.service.js";
import { Tenancy } from "./tenancy.entity.js";
import { referenceKey } from "../../../src/lib/domain/tenancy-reference.js";

/** What a landlord's tenancy file says of a tenancy. */
export type ImportedTenancy = Pick<Tenancy, "propertyId" | "startDate" | "endDate" | "accessNeeds" | "householdVulnerability">;

/** Rows of a tenancy file in one statement: a JSON parameter of a megabyte or two at most. */
const IMPORT_ROWS_PER_STATEMENT = 5000;

/** A tenancy of the file as JSON_TABLE reads it (`IMPORTED_ROWS`). */
const importedRow = (reference: string | null, tenantUserId: number | null, t: ImportedTenancy, id: number | null = null) => [
  id,
  reference,
  t.propertyId,
  tenantUserId,
  t.startDate,
  t.endDate,
  t.accessNeeds,
  t.householdVulnerability,
];

const IMPORTED_ROWS =
  "JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (ord FOR ORDINALITY, id INT UNSIGNED PATH '$[0]', reference VARCHAR(64) PATH '$[1]', " +
  "property_id INT UNSIGNED PATH '$[2]', tenant_user_id INT UNSIGNED PATH '$[3]', start_date DATE PATH '$[4]', end_date DATE PATH '$[5]', " +
  "access_needs TEXT PATH '$[6]', household_vulnerability TEXT PATH '$[7]')) AS j";

export class TenancyService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly properties: PropertyService,
    private readonly clock: Clock,
  ) {}

  /**
   * Today's date in London, against which tenancies' start and end dates (calendar dates, inclusive)
   * are read: a tenancy ending on the 31st runs until midnight London time, whatever the UTC date.
   */
  today(): string {
    return localDate(this.clock.now());
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

  /**
   * Whether the tenant has a tenancy of the home running today. A tenant sees a home's cases only
   * while this holds: from the day after their tenancy's end date, that home's cases are closed to them.
   */
  async livesThereNow(tenantUserId: number, propertyId: number, m: EntityManager = this.dataSource.manager): Promise<boolean> {
    const d = this.today();
    return m
      .getRepository(Tenancy)
      .createQueryBuilder("t")
      .where("t.tenant_user_id = :tenantUserId AND t.property_id = :propertyId", { tenantUserId, propertyId })
      .andWhere("t.start_date <= :today AND (t.end_date IS NULL OR t.end_date >= :today)", { today: d })
      .getExists();
  }

  /** The homes the tenant has a tenancy of today. */
  async currentHomesOf(tenantUserId: number): Promise<number[]> {
    const d = this.today();
    const rows = await this.dataSource
      .getRepository(Tenancy)
      .createQueryBuilder("t")
      .select("DISTINCT t.property_id", "propertyId")
      .where("t.tenant_user_id = :tenantUserId", { tenantUserId })
      .andWhere("t.start_date <= :today AND (t.end_date IS NULL OR t.end_date >= :today)", { today: d })
      .getRawMany<{ propertyId: number }>();
    return rows.map((r) => Number(r.propertyId));
  }

  /** The landlord's tenancies with these references, locked for the caller's transaction. */
  async byReferences(
    m: EntityManager,
    organisationId: number,
    references: readonly string[],
  ): Promise<Map<string, ImportedTenancy & { id: number; tenantUserId: number }>> {
    // Keyed as the database compares references (see referenceKey), whatever case the file uses.
    const out = new Map<string, ImportedTenancy & { id: number; tenantUserId: number }>();
    for (let i = 0; i < references.length; i += IMPORT_ROWS_PER_STATEMENT) {
      const rows = (await m.query(
        "SELECT t.id, t.reference, t.property_id, t.tenant_user_id, DATE_FORMAT(t.start_date, '%Y-%m-%d') AS start_date, " +
          "DATE_FORMAT(t.end_date, '%Y-%m-%d') AS end_date, t.access_needs, t.household_vulnerability " +
          "FROM JSON_TABLE(CONVERT(? USING utf8mb4), '$[*]' COLUMNS (reference VARCHAR(64) PATH '$')) AS j " +
          "JOIN tenancies t ON t.organisation_id = ? AND t.reference = j.reference FOR UPDATE",
        [JSON.stringify(references.slice(i, i + IMPORT_ROWS_PER_STATEMENT)), organisationId],
      )) as Record<string, string | number | null>[];
      for (const r of rows) {
        out.set(referenceKey(String(r.reference)), {
          id: Number(r.id),
          propertyId: Number(r.property_id),
          tenantUserId: Number(r.tenant_user_id),
          startDate: String(r.start_date),
          endDate: r.end_date === null ? null : String(r.end_date),
          accessNeeds: r.access_needs === null ? null : String(r.access_needs),
          householdVulnerability: r.household_vulnerability === null ? null : String(r.household_vulnerability),
        });
      }
    }
    return out;
  }

  /**
   * Tenancies from the landlord's file, with their references, in the caller's transaction: a few
   * thousand a statement, each batch one JSON parameter (as the readings import does).
   */
  async createImported(
    m: EntityManager,
    organisationId: number,
    rows: readonly (ImportedTenancy & { reference: string; tenantUserId: number })[],
  ): Promise<void> {
    for (let i = 0; i < rows.length; i += IMPORT_ROWS_PER_STATEMENT) {
      const chunk = rows.slice(i, i + IMPORT_ROWS_PER_STATEMENT);
      await m.query(
        "INSERT INTO tenancies (organisation_id, reference, property_id, tenant_user_id, start_date, end_date, access_needs, household_vulnerability, household_notes) " +
          `SELECT ?, j.reference, j.property_id, j.tenant_user_id, j.start_date, j.end_date, j.access_needs, j.household_vulnerability, NULL FROM ${IMPORTED_ROWS} ORDER BY j.ord`,
        [organisationId, JSON.stringify(chunk.map((t) => importedRow(t.reference, t.tenantUserId, t)))],
      );
    }
  }

  /** Sets referenced tenancies' dates and consented details as the file has them (inside the caller's transaction). */
  async updateImported(
    m: EntityManager,
    organisationId: number,
    rows: readonly (ImportedTenancy & { id: number })[],
  ): Promise<void> {
    for (let i = 0; i < rows.length; i += IMPORT_ROWS_PER_STATEMENT) {
      const chunk = rows.slice(i, i + IMPORT_ROWS_PER_STATEMENT);
      await m.query(
        `UPDATE tenancies t JOIN ${IMPORTED_ROWS} ON t.id = j.id ` +
          "SET t.start_date = j.start_date, t.end_date = j.end_date, t.access_needs = j.access_needs, t.household_vulnerability = j.household_vulnerability " +
          "WHERE t.organisation_id = ? AND t.property_id = j.property_id",
        [JSON.stringify(chunk.map((t) => importedRow(null, null, t, t.id))), organisationId],
      );
    }
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
