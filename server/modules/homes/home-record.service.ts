// A home's page for staff: who lives there, its cases and its readings. Each part comes from the
// module that owns it; this module only puts them together (nothing depends on it).
import type { Actor } from "../../lib/actor.js";
import type { Case, CaseService } from "../cases/case.service.js";
import type { Property, PropertyService } from "../properties/property.service.js";
import type { ReadingService } from "../readings/reading.service.js";
import type { TenancyService } from "../tenancies/tenancy.service.js";
import type { UserService } from "../users/user.service.js";

/** How many of each room's latest readings the page shows. */
export const READINGS_PER_ROOM = 5;

export class HomeRecordService {
  constructor(
    private readonly properties: PropertyService,
    private readonly tenancies: TenancyService,
    private readonly cases: CaseService,
    private readonly readings: ReadingService,
    private readonly users: UserService,
  ) {}

  /** Every tenancy of the home with the tenant's name; 404 for a home of another organisation. */
  async tenants(actor: Actor, propertyId: number) {
    await this.properties.getForStaff(actor, propertyId);
    const tenancies = await this.tenancies.ofHome(propertyId);
    const ids = tenancies.map((t) => t.tenantUserId);
    const [people, languages] = await Promise.all([this.users.people(ids), this.users.languagesOf(ids)]);
    return tenancies.flatMap((t) => {
      const person = people.get(t.tenantUserId);
      return person ? [{ tenancy: t, person: { ...person, language: languages.get(person.id) ?? null } }] : [];
    });
  }

  /** The home's cases, newest first, each with its tenant's name. */
  async casesOf(actor: Actor, propertyId: number): Promise<{ case: Case; tenantName: string | null }[]> {
    await this.properties.getForStaff(actor, propertyId);
    const cases = await this.cases.forHome(actor.organisationId, propertyId);
    const people = await this.users.people(cases.flatMap((c) => (c.tenantUserId ? [c.tenantUserId] : [])));
    return cases.map((c) => ({ case: c, tenantName: c.tenantUserId ? (people.get(c.tenantUserId)?.name ?? null) : null }));
  }

  /** Each room of the home with its reading count and latest readings (rooms with none included). */
  async readingsOf(actor: Actor, propertyId: number) {
    const home: Property = await this.properties.getForStaff(actor, propertyId);
    const byRoom = new Map((await this.readings.latestByRoom(propertyId, READINGS_PER_ROOM)).map((r) => [r.roomId, r]));
    return (home.rooms ?? [])
      .slice()
      .sort((a, b) => a.id - b.id)
      .map((room) => ({ room, count: byRoom.get(room.id)?.count ?? 0, latest: byRoom.get(room.id)?.latest ?? [] }));
  }
}
