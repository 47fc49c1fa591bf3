// Test data written through TypeORM into the real database. Every call makes fresh, unique rows,
// so test files can run side by side on one database.
import { randomUUID } from "node:crypto";
import type { DataSource } from "typeorm";
import { hashPassword } from "../../server/modules/auth/passwords.js";
import { Organisation } from "../../server/modules/organisations/organisation.entity.js";
import { Property } from "../../server/modules/properties/property.entity.js";
import { Room } from "../../server/modules/properties/room.entity.js";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { User, type Role } from "../../server/modules/users/user.entity.js";

export const PASSWORD = "correct horse battery";
let passwordHash: Promise<string> | undefined;
const unique = () => randomUUID().slice(0, 8);

export async function makeOrganisation(ds: DataSource, name = `Test Homes ${unique()}`) {
  return ds.getRepository(Organisation).save({ name });
}

export async function makeUser(ds: DataSource, org: Organisation, role: Role, over: Partial<User> = {}) {
  passwordHash ??= hashPassword(PASSWORD);
  return ds.getRepository(User).save(
    ds.getRepository(User).create({
      organisationId: org.id,
      email: `${role}.${unique()}@test.example`,
      name: `Test ${role}`,
      role,
      status: "active",
      passwordHash: await passwordHash,
      ...over,
    }),
  );
}

export async function makeProperty(ds: DataSource, org: Organisation, over: Partial<Property> = {}) {
  const property = await ds.getRepository(Property).save({
    organisationId: org.id,
    addressLine1: `${Math.floor(Math.random() * 200) + 1} Test Street ${unique()}`,
    addressLine2: null,
    town: "Testford",
    postcode: "ZX1 1AA",
    uprn: null,
    estate: "Test Estate",
    block: null,
    builtForm: "mid-terrace",
    wallType: "solid-brick",
    glazingType: "single",
    heatingType: "gas-boiler",
    ...over,
  });
  await ds.getRepository(Room).save([
    { propertyId: property.id, name: "Bedroom", kind: "bedroom" },
    { propertyId: property.id, name: "Kitchen", kind: "kitchen" },
  ]);
  return property;
}

export async function makeTenant(ds: DataSource, org: Organisation, property: Property, over: Partial<User> = {}) {
  const tenant = await makeUser(ds, org, "tenant", over);
  await ds
    .getRepository(Tenancy)
    .save({ propertyId: property.id, tenantUserId: tenant.id, startDate: "2024-01-01", endDate: null, householdNotes: null });
  return tenant;
}

/** An organisation with a home, its tenant and one user of each staff role. */
export async function makeLandlord(ds: DataSource) {
  const org = await makeOrganisation(ds);
  const home = await makeProperty(ds, org);
  const tenant = await makeTenant(ds, org, home);
  const officer = await makeUser(ds, org, "officer");
  const maintenance = await makeUser(ds, org, "maintenance");
  const admin = await makeUser(ds, org, "admin");
  return { org, home, tenant, officer, maintenance, admin };
}
