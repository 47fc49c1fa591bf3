// The landlord the fault scripts (`npm run fault`, `npm run test:faults`) load: officers, an admin and any
// other staff, and homes of two rooms, each with a tenant, all signing in with one password.
import { createDataSource } from "../../server/db/create-data-source.js";
import { hashPassword } from "../../server/modules/auth/passwords.js";
import { Organisation } from "../../server/modules/organisations/organisation.entity.js";
import { Property } from "../../server/modules/properties/property.entity.js";
import { Room } from "../../server/modules/properties/room.entity.js";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { User, type Role } from "../../server/modules/users/user.entity.js";
import type { AppDatabase } from "./mariadb.js";

export interface FaultLandlord {
  /** The organisation's name. */
  name: string;
  /** Accounts are `<role>.<n>@<emailDomain>`, named `<namePrefix> <role> <n>`. */
  emailDomain: string;
  namePrefix: string;
  password: string;
  officers: number;
  /** Staff besides the officers and the one admin (one account each). */
  otherStaff?: Role[];
  homes: number;
  /** Each home is `<n> <street>`; the rest of its record is the same for all. */
  street: string;
  home: Pick<Property, "town" | "postcode" | "estate" | "builtForm" | "wallType" | "glazingType" | "heatingType">;
  /** The home's rooms; tenants report in the first. */
  rooms: [Pick<Room, "name" | "kind">, Pick<Room, "name" | "kind">];
}

export interface SeededLandlord {
  officers: string[];
  admin: string;
  tenants: { email: string; propertyId: number; roomId: number }[];
}

/** Writes the landlord into the database at 127.0.0.1:`port`. */
export async function seedFaultLandlord(db: AppDatabase & { port: number }, o: FaultLandlord): Promise<SeededLandlord> {
  const ds = createDataSource({ host: "127.0.0.1", ...db });
  await ds.initialize();
  try {
    const passwordHash = await hashPassword(o.password);
    const org = await ds.getRepository(Organisation).save({ name: o.name });
    const user = (role: Role, n: number) =>
      ds.getRepository(User).save(
        ds.getRepository(User).create({
          organisationId: org.id,
          email: `${role}.${n}@${o.emailDomain}`,
          name: `${o.namePrefix} ${role} ${n}`,
          role,
          status: "active",
          passwordHash,
        }),
      );
    const officers = [];
    for (let i = 1; i <= o.officers; i++) officers.push((await user("officer", i)).email);
    const admin = (await user("admin", 1)).email;
    for (const role of o.otherStaff ?? []) await user(role, 1);
    const tenants: SeededLandlord["tenants"] = [];
    for (let i = 1; i <= o.homes; i++) {
      const home = await ds.getRepository(Property).save({
        organisationId: org.id,
        addressLine1: `${i} ${o.street}`,
        addressLine2: null,
        uprn: null,
        block: null,
        ...o.home,
      });
      const [room] = await ds.getRepository(Room).save(o.rooms.map((r) => ({ propertyId: home.id, ...r })));
      const tenant = await user("tenant", i);
      await ds
        .getRepository(Tenancy)
        .save({ propertyId: home.id, tenantUserId: tenant.id, startDate: "2024-01-01", endDate: null, householdNotes: null });
      tenants.push({ email: tenant.email, propertyId: home.id, roomId: room!.id });
    }
    return { officers, admin, tenants };
  } finally {
    await ds.destroy();
  }
}
