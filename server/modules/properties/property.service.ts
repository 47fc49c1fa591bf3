import { Brackets, QueryFailedError, type DataSource, type EntityManager } from "typeorm";
import { keysetAfter, type KeyTerm, type KeysetPage } from "../../lib/table-export.js";
import type { HomeInput, HomePatch, RoomInput, RoomPatch } from "../../../src/lib/schemas/homes.js";
import { ConflictError, NotFoundError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { escapeLike } from "../../lib/sql.js";
import type { Actor } from "../../lib/actor.js";
import type { PropertyListQuery } from "./properties.schemas.js";
import { Property } from "./property.entity.js";
import { Room } from "./room.entity.js";

/** The records other modules receive from this service (they never query the entities themselves). */
export type { Property } from "./property.entity.js";
export type { Room } from "./room.entity.js";

/**
 * Whether anything was measured in a room (the readings module answers; properties import no reading
 * code). Asked inside the transaction that deletes the room.
 */
export interface RoomReadingsCounter {
  readingsInRoom(propertyId: number, roomId: number, m: EntityManager): Promise<number>;
}

const isDuplicate = (error: unknown) =>
  error instanceof QueryFailedError &&
  ((error.driverError as { code?: string; errno?: number } | undefined)?.code === "ER_DUP_ENTRY" ||
    (error.driverError as { errno?: number } | undefined)?.errno === 1062);

/** Where a keyset page of the homes list ends. */
/** The homes list's order: estate, then the natural order of block and address (sort_key, kept by MariaDB), then the id. */
const HOME_SORT: readonly KeyTerm[] = [{ expr: "p.estate" }, { expr: "p.sort_key" }, { expr: "p.id" }];

const uprnTaken = (uprn: string | null | undefined) =>
  new ConflictError(`Another home already has the UPRN ${uprn ?? ""}.`, [
    { field: "uprn", message: "Another of your homes already has this UPRN." },
  ]);

/** The fields an admin may set, as they are stored. */
const HOME_FIELDS = [
  "addressLine1",
  "addressLine2",
  "town",
  "postcode",
  "uprn",
  "estate",
  "block",
  "builtForm",
  "wallType",
  "glazingType",
  "heatingType",
  "ventilation",
  "latitude",
  "longitude",
] as const;

export class PropertyService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly logger?: Logger,
  ) {}

  /** There is no audit table yet: each change by an admin is one structured log line, with who, what and the fields. */
  private audit(actor: Actor, action: string, details: Record<string, unknown>) {
    this.logger?.info({ audit: action, actorId: actor.id, organisationId: actor.organisationId, ...details }, `audit: ${action}`);
  }

  /** The homes list's filters, on `p`: one definition for the screen's pages and the export's. */
  private filtered(actor: Actor, query: Pick<PropertyListQuery, "q" | "estate">) {
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
            .orWhere("p.estate LIKE :like", { like })
            .orWhere("p.block LIKE :like", { like })
            .orWhere("REPLACE(p.postcode, ' ', '') LIKE :pc", { pc: compactPostcode })
            .orWhere("p.uprn = :exact", { exact: query.q }),
        ),
      );
    }
    // sort_key is the natural order of block and address (Flat 2 before Flat 10), kept by MariaDB.
    qb.orderBy();
    for (const term of HOME_SORT) qb.addOrderBy(term.expr, "ASC");
    return qb;
  }

  /** Staff only (the route checks the role): homes of the actor's organisation. */
  async list(actor: Actor, query: PropertyListQuery): Promise<{ items: Property[]; total: number }> {
    const [items, total] = await this.filtered(actor, query)
      .skip((query.page - 1) * query.pageSize)
      .take(query.pageSize)
      .getManyAndCount();
    return { items, total };
  }

  /**
   * The next `limit` homes of the list after `after` (in the list's order), for exports: a keyset
   * page costs the same at the 100 000th home as at the first, where an offset page reads every home before it.
   */
  async listAfter(
    actor: Actor,
    query: Pick<PropertyListQuery, "q" | "estate">,
    after: readonly unknown[] | null,
    limit: number,
  ): Promise<KeysetPage<Property>> {
    const qb = this.filtered(actor, query).addSelect("p.sortKey").take(limit);
    if (after) {
      const { sql, params } = keysetAfter(HOME_SORT, after);
      qb.andWhere(sql, params);
    }
    const rows = await qb.getMany();
    const tail = rows.at(-1);
    return { rows, last: tail ? [tail.estate, tail.sortKey, tail.id] : null };
  }

  /** A home of the actor's organisation with its rooms; 404 for anything else, so other landlords' homes stay invisible. */
  async getForStaff(actor: Actor, id: number): Promise<Property> {
    const property = await this.dataSource
      .getRepository(Property)
      .findOne({ where: { id, organisationId: actor.organisationId }, relations: { rooms: true } });
    if (!property) throw new NotFoundError("No such home.");
    return property;
  }

  /** The id of the actor's organisation's home with this UPRN, or null (UPRNs are unique per organisation). */
  async idByUprn(actor: Actor, uprn: string): Promise<number | null> {
    const home = await this.dataSource
      .getRepository(Property)
      .findOne({ where: { organisationId: actor.organisationId, uprn }, select: { id: true } });
    return home?.id ?? null;
  }

  /** The landlord's homes with these UPRNs: UPRN → home id (a tenancy import matches its rows by them). */
  async idsByUprn(organisationId: number, uprns: readonly string[], m: EntityManager = this.dataSource.manager) {
    const out = new Map<string, number>();
    for (let i = 0; i < uprns.length; i += 1000) {
      const chunk = uprns.slice(i, i + 1000);
      if (chunk.length === 0) continue;
      const rows = await m
        .getRepository(Property)
        .createQueryBuilder("p")
        .select(["p.id", "p.uprn"])
        .where("p.organisation_id = :organisationId AND p.uprn IN (:...chunk)", { organisationId, chunk })
        .getMany();
      for (const p of rows) out.set(p.uprn!, p.id);
    }
    return out;
  }

  /** The tenant's home with its rooms (TenancyService has decided it is theirs). */
  async homeWithRooms(id: number): Promise<Property> {
    return this.dataSource.getRepository(Property).findOneOrFail({ where: { id }, relations: { rooms: true } });
  }

  /** Where a home is, as far as this module knows: its own coordinates (or nulls), its landlord and estate. */
  async placeOf(
    id: number,
  ): Promise<{ organisationId: number; estate: string; latitude: number | null; longitude: number | null } | null> {
    const p = await this.dataSource.getRepository(Property).findOne({
      where: { id },
      select: { id: true, organisationId: true, estate: true, latitude: true, longitude: true },
    });
    return p ? { organisationId: p.organisationId, estate: p.estate, latitude: p.latitude, longitude: p.longitude } : null;
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

  /** Admin: a new home of the actor's organisation, with its rooms, in one transaction. */
  async create(actor: Actor, input: HomeInput): Promise<Property> {
    const id = await this.dataSource
      .transaction(async (m) => {
        const saved = await m.getRepository(Property).save(
          m.getRepository(Property).create({
            organisationId: actor.organisationId,
            ...Object.fromEntries(HOME_FIELDS.map((f) => [f, input[f]])),
          }),
        );
        if (input.rooms.length) {
          await m.getRepository(Room).save(input.rooms.map((r) => ({ propertyId: saved.id, name: r.name, kind: r.kind })));
        }
        return saved.id;
      })
      .catch((error: unknown) => {
        throw isDuplicate(error) ? uprnTaken(input.uprn) : error;
      });
    this.audit(actor, "home-created", { propertyId: id, rooms: input.rooms.length });
    return this.getForStaff(actor, id);
  }

  /** Admin: changes the fields sent; 404 for a home of another organisation. */
  async update(actor: Actor, id: number, patch: HomePatch): Promise<Property> {
    const changed = await this.dataSource
      .transaction(async (m) => {
        const home = await m
          .getRepository(Property)
          .findOne({ where: { id, organisationId: actor.organisationId }, lock: { mode: "pessimistic_write" } });
        if (!home) throw new NotFoundError("No such home.");
        const changes: Record<string, { from: unknown; to: unknown }> = {};
        for (const f of HOME_FIELDS) {
          const to = patch[f];
          if (to === undefined || to === home[f]) continue;
          changes[f] = { from: home[f], to };
        }
        if (Object.keys(changes).length) {
          await m.getRepository(Property).update({ id }, Object.fromEntries(Object.entries(changes).map(([f, c]) => [f, c.to])));
        }
        return changes;
      })
      .catch((error: unknown) => {
        throw isDuplicate(error) ? uprnTaken(patch.uprn) : error;
      });
    if (Object.keys(changed).length) this.audit(actor, "home-updated", { propertyId: id, changes: changed });
    return this.getForStaff(actor, id);
  }

  /** Admin: a new room in a home of the actor's organisation. */
  async addRoom(actor: Actor, propertyId: number, input: RoomInput): Promise<Room> {
    await this.getForStaff(actor, propertyId);
    const room = await this.dataSource
      .getRepository(Room)
      .save(this.dataSource.getRepository(Room).create({ propertyId, name: input.name, kind: input.kind }));
    this.audit(actor, "room-added", { propertyId, roomId: room.id, name: room.name, kind: room.kind });
    return room;
  }

  private async roomOf(m: EntityManager, actor: Actor, propertyId: number, roomId: number): Promise<Room> {
    await this.getForStaff(actor, propertyId);
    const room = await m.getRepository(Room).findOne({ where: { id: roomId, propertyId }, lock: { mode: "pessimistic_write" } });
    if (!room) throw new NotFoundError("No such room in this home.");
    return room;
  }

  /** Admin: renames a room or changes its kind. */
  async updateRoom(actor: Actor, propertyId: number, roomId: number, patch: RoomPatch): Promise<Room> {
    const { room, before } = await this.dataSource.transaction(async (m) => {
      const room = await this.roomOf(m, actor, propertyId, roomId);
      const before = { name: room.name, kind: room.kind };
      if (patch.name !== undefined) room.name = patch.name;
      if (patch.kind !== undefined) room.kind = patch.kind;
      await m.getRepository(Room).save(room);
      return { room, before };
    });
    this.audit(actor, "room-updated", { propertyId, roomId, from: before, to: { name: room.name, kind: room.kind } });
    return room;
  }

  /**
   * Admin: removes a room. A room with readings stays (409 naming how many): the readings belong to
   * cases and the risk figures were worked out from them. Its row is locked while the readings are
   * counted, in one transaction.
   */
  async deleteRoom(actor: Actor, propertyId: number, roomId: number, readings: RoomReadingsCounter): Promise<void> {
    const name = await this.dataSource.transaction(async (m) => {
      const room = await this.roomOf(m, actor, propertyId, roomId);
      const n = await readings.readingsInRoom(propertyId, roomId, m);
      if (n > 0) {
        throw new ConflictError(
          `"${room.name}" has ${n} ${n === 1 ? "reading" : "readings"}, so it cannot be removed: the readings belong to cases of this home. Rename it instead if its name is wrong.`,
          { code: "room_has_readings", readings: n },
        );
      }
      await m.getRepository(Room).delete({ id: roomId });
      return room.name;
    });
    this.audit(actor, "room-removed", { propertyId, roomId, name });
  }
}
