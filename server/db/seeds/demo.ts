// The demo scenario: a fictional landlord, Brackenfold Housing Association, with 120 homes on three
// estates of its own invention, plus a small second landlord to show that organisations are kept apart.
// Every name, address and postcode here is made up.
import type { DataSource, EntityManager } from "typeorm";
import { hashPassword } from "../../modules/auth/passwords.js";
import { Organisation } from "../../modules/organisations/organisation.entity.js";
import type { BuiltForm, GlazingType, HeatingType, WallType } from "../../modules/properties/property.entity.js";
import { Property } from "../../modules/properties/property.entity.js";
import { Room, type RoomKind } from "../../modules/properties/room.entity.js";
import { Tenancy } from "../../modules/tenancies/tenancy.entity.js";
import { EstateLocation } from "../../modules/weather/estate-location.entity.js";
import { User, type Role } from "../../modules/users/user.entity.js";
import { mulberry32 } from "../../lib/random.js";
import { seedDemoCases } from "./demo-cases.js";

export const DEMO_ORGANISATION = "Brackenfold Housing Association";
const OTHER_ORGANISATION = "Fernhollow Lettings";

export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
  { email: "tenant@example.org", name: "Robin Ashdown", role: "tenant" },
  { email: "tenant2@example.org", name: "Sam Okonjo-Reyes", role: "tenant" },
  { email: "officer@example.org", name: "Priya Venn", role: "officer" },
  { email: "maintenance@example.org", name: "Dale Whitcombe", role: "maintenance" },
  { email: "admin@example.org", name: "Morgan Castell", role: "admin" },
];
const OTHER_ADMIN = { email: "admin@fernhollow.example.org", name: "Jo Farrant", role: "admin" as const };

interface EstatePlan {
  estate: string;
  town: string;
  outward: string;
  streets: string[];
  homes: number;
  /**
   * Where the estate is, for its weather (made-up points in the north of England): on each home
   * (spread a little around it) or only on the estate, so the demo shows both.
   */
  location: { latitude: number; longitude: number; on: "homes" | "estate" };
  pick(i: number): {
    builtForm: BuiltForm;
    wallType: WallType;
    glazingType: GlazingType;
    heatingType: HeatingType;
    block: string | null;
  };
}

const rand = mulberry32(20261202);
const choose = <T>(items: readonly T[]) => items[Math.floor(rand() * items.length)]!;

const ESTATES: EstatePlan[] = [
  {
    // Pre-1919 terraces: solid brick, a mix of original single glazing and early double glazing.
    estate: "Millbeck Terraces",
    town: "Easterby",
    outward: "ZX3",
    streets: ["Tanner Row", "Weaver Street", "Coalyard Lane", "Bobbin Walk"],
    homes: 45,
    location: { latitude: 53.62, longitude: -1.78, on: "homes" },
    pick: (i) => ({
      builtForm: i % 9 === 0 ? "end-terrace" : "mid-terrace",
      wallType: i % 7 === 0 ? "solid-stone" : "solid-brick",
      glazingType: choose(["single", "old-double", "old-double", "mixed"] as const),
      heatingType: choose(["gas-boiler", "gas-boiler", "gas-boiler", "electric-direct"] as const),
      block: null,
    }),
  },
  {
    // 1960s system-built low-rise flats and maisonettes.
    estate: "Kestrel Rise",
    town: "Easterby",
    outward: "ZX5",
    streets: ["Harrier Court", "Merlin House", "Falcon House"],
    homes: 40,
    location: { latitude: 53.64, longitude: -1.74, on: "estate" },
    pick: (i) => ({
      builtForm: i % 5 === 0 ? "maisonette" : "flat",
      wallType: "system-built",
      glazingType: choose(["single", "old-double", "modern-double"] as const),
      heatingType: choose(["electric-storage", "electric-storage", "district", "gas-boiler"] as const),
      block: ["Harrier Court", "Merlin House", "Falcon House"][i % 3]!,
    }),
  },
  {
    // 1990s cavity-walled semis and bungalows, cavities filled in a later programme (not all of them).
    estate: "Orchard Green",
    town: "Wensford",
    outward: "ZX8",
    streets: ["Pippin Close", "Russet Way", "Quince Gardens"],
    homes: 35,
    location: { latitude: 53.41, longitude: -1.48, on: "estate" },
    pick: (i) => ({
      builtForm: i % 6 === 0 ? "bungalow" : i % 4 === 0 ? "end-terrace" : "semi-detached",
      wallType: i % 3 === 0 ? "unfilled-cavity" : "filled-cavity",
      glazingType: choose(["old-double", "modern-double", "modern-double"] as const),
      heatingType: choose(["gas-boiler", "gas-boiler", "heat-pump"] as const),
      block: null,
    }),
  },
];

function roomsFor(builtForm: BuiltForm, bedrooms: number): { name: string; kind: RoomKind }[] {
  const rooms: { name: string; kind: RoomKind }[] = [
    { name: "Living room", kind: "living" },
    { name: "Kitchen", kind: "kitchen" },
    { name: "Bathroom", kind: "bathroom" },
  ];
  for (let b = 1; b <= bedrooms; b++) rooms.push({ name: bedrooms === 1 ? "Bedroom" : `Bedroom ${b}`, kind: "bedroom" });
  if (builtForm !== "flat" && builtForm !== "bungalow") rooms.push({ name: "Hallway and stairs", kind: "other" });
  return rooms;
}

const postcode = (outward: string, n: number) =>
  `${outward} ${(n % 9) + 1}${"ABDEFGHJLNPQRSTUWXYZ"[n % 20]}${"ABDEFGHJLNPQRSTUWXYZ"[(n * 7) % 20]}`;

async function createOrganisationWithHomes(m: EntityManager, passwordHash: string) {
  const org = await m.getRepository(Organisation).save({ name: DEMO_ORGANISATION });
  const users = m.getRepository(User);
  const accounts = new Map<string, User>();
  for (const a of DEMO_ACCOUNTS) {
    accounts.set(a.email, await users.save(users.create({ ...a, organisationId: org.id, passwordHash, status: "active" })));
  }
  let n = 0;
  const homes: Property[] = [];
  for (const plan of ESTATES) {
    const { latitude, longitude, on } = plan.location;
    if (on === "estate") {
      await m
        .getRepository(EstateLocation)
        .save({ organisationId: org.id, estate: plan.estate, latitude, longitude, updatedAt: new Date() });
    }
    for (let i = 0; i < plan.homes; i++, n++) {
      const kind = plan.pick(i);
      const street = plan.streets[i % plan.streets.length]!;
      const number = Math.floor(i / plan.streets.length) * 2 + 1 + (i % 2);
      const isFlat = kind.builtForm === "flat" || kind.builtForm === "maisonette";
      const property = await m.getRepository(Property).save({
        organisationId: org.id,
        addressLine1: isFlat ? `Flat ${number}, ${kind.block}` : `${number} ${street}`,
        addressLine2: isFlat ? "Kestrel Rise" : null,
        town: plan.town,
        postcode: postcode(plan.outward, n),
        // Fictional UPRNs in a range of our own; roughly two thirds of homes have one recorded.
        uprn: n % 3 === 2 ? null : String(990000100000 + n),
        estate: plan.estate,
        ...kind,
        ...(on === "homes" ? { latitude: latitude + ((i % 5) - 2) * 0.004, longitude: longitude + ((i % 7) - 3) * 0.004 } : {}),
      });
      const bedrooms = kind.builtForm === "flat" ? 1 + (i % 2) : kind.builtForm === "bungalow" ? 2 : 2 + (i % 2);
      await m.getRepository(Room).save(roomsFor(kind.builtForm, bedrooms).map((r) => ({ ...r, propertyId: property.id })));
      homes.push(property);
    }
  }
  // The two named demo tenants: a Millbeck terrace and a Kestrel Rise flat.
  const tenancies = m.getRepository(Tenancy);
  const firstKestrel = homes.find((h) => h.estate === "Kestrel Rise" && h.builtForm === "flat")!;
  await tenancies.save([
    {
      propertyId: homes[0]!.id,
      tenantUserId: accounts.get("tenant@example.org")!.id,
      startDate: "2021-04-12",
      endDate: null,
      householdNotes: "Two adults and a child under five.",
    },
    {
      propertyId: firstKestrel.id,
      tenantUserId: accounts.get("tenant2@example.org")!.id,
      startDate: "2023-09-01",
      endDate: null,
      householdNotes: null,
    },
  ]);
  // Tenant accounts for about half of the other homes.
  let t = 0;
  for (const home of homes) {
    if (home.id === homes[0]!.id || home.id === firstKestrel.id || rand() < 0.45) continue;
    t++;
    const user = await users.save(
      users.create({
        email: `tenant.${String(t).padStart(3, "0")}@example.org`,
        name: `Demo Tenant ${t}`,
        role: "tenant",
        organisationId: org.id,
        passwordHash,
        status: "active",
      }),
    );
    await tenancies.save({
      propertyId: home.id,
      tenantUserId: user.id,
      startDate: `20${15 + (t % 10)}-0${1 + (t % 9)}-15`,
      endDate: null,
      householdNotes: null,
    });
  }
  return { homes: homes.length, tenants: t + 2 };
}

async function createOtherOrganisation(m: EntityManager, passwordHash: string) {
  const org = await m.getRepository(Organisation).save({ name: OTHER_ORGANISATION });
  await m.getRepository(User).save({ ...OTHER_ADMIN, organisationId: org.id, passwordHash, status: "active" });
  for (let i = 1; i <= 3; i++) {
    const p = await m.getRepository(Property).save({
      organisationId: org.id,
      addressLine1: `${i * 4} Lantern Yard`,
      addressLine2: null,
      town: "Wensford",
      postcode: `ZX9 ${i}QT`,
      uprn: null,
      estate: "Lantern Yard",
      block: null,
      builtForm: "mid-terrace",
      wallType: "solid-brick",
      glazingType: "old-double",
      heatingType: "gas-boiler",
    });
    await m.getRepository(Room).save(roomsFor("mid-terrace", 2).map((r) => ({ ...r, propertyId: p.id })));
  }
}

/**
 * Creates the demo once; on later runs only resets the demo accounts' password to `password`.
 * Everything is written in one transaction, so an interrupted seed leaves nothing behind. The demo
 * cases are dated back from `now` (tests pass their clock's).
 */
export async function seedDemo(
  dataSource: DataSource,
  password: string,
  now: Date = new Date(),
): Promise<{ created: boolean; homes?: number; tenants?: number; cases: number }> {
  const passwordHash = await hashPassword(password);
  return dataSource.transaction(async (m) => {
    const existing = await m.getRepository(Organisation).findOneBy({ name: DEMO_ORGANISATION });
    if (existing) {
      for (const a of [...DEMO_ACCOUNTS, OTHER_ADMIN]) {
        await m.getRepository(User).update({ email: a.email }, { passwordHash, status: "active" });
      }
      // A demo seeded before there were demo cases gets them now.
      const cases = await seedDemoCases(m, existing.id, now);
      return { created: false, cases };
    }
    const counts = await createOrganisationWithHomes(m, passwordHash);
    await createOtherOrganisation(m, passwordHash);
    const org = await m.getRepository(Organisation).findOneByOrFail({ name: DEMO_ORGANISATION });
    const cases = await seedDemoCases(m, org.id, now);
    return { created: true, ...counts, cases };
  });
}
