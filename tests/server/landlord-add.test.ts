// `npm run landlord:add`: a fresh landlord with the default deadline timeframes and its first
// administrator, invited by the usual e-mail; the admin accepts, signs in and finds an empty landlord
// that sees nothing of anyone else's. Refusals (same name, bad or used address) write nothing.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import { Organisation } from "../../server/modules/organisations/organisation.entity.js";
import { OrganisationService, type LandlordOnboarding } from "../../server/modules/organisations/organisation.service.js";
import { User } from "../../server/modules/users/user.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { anonymousClient, createTestApp, signedInClient, type TestApp } from "../support/test-app.js";

let t: TestApp;
let organisations: OrganisationService;
let onboarding: LandlordOnboarding;
let other: Awaited<ReturnType<typeof makeLandlord>>;

beforeAll(async () => {
  t = await createTestApp();
  organisations = new OrganisationService(t.ctx.dataSource);
  onboarding = { accounts: t.ctx.services.users, invitations: t.ctx.services.auth };
  other = await makeLandlord(t.ctx.dataSource);
});
afterAll(() => t.close());

const unique = () => randomUUID().slice(0, 8);

/** What a refusal must leave untouched. */
async function counts() {
  const ds = t.ctx.dataSource;
  return {
    landlords: await ds.getRepository(Organisation).count(),
    accounts: await ds.getRepository(User).count(),
    emails: await ds.getRepository(OutboxEmail).count(),
  };
}

describe("adding a landlord", () => {
  it("invites the first admin, who signs in to an empty landlord on the default timeframes and sees no one else's data", async () => {
    const name = `Fenwold Housing ${unique()}`;
    const email = `First.Admin.${unique()}@Test.Example`;
    const added = await organisations.addLandlord({ name, adminEmail: email, adminName: "Ines Harrow" }, onboarding);
    expect(added).toMatchObject({ name, admin: { email: email.toLowerCase(), name: "Ines Harrow" } });

    const account = await t.ctx.dataSource.getRepository(User).findOneByOrFail({ id: added.admin.id });
    expect(account).toMatchObject({ role: "admin", status: "invited", passwordHash: null, organisationId: added.organisationId });

    const mail = await t.mail.lastTo(email.toLowerCase());
    expect(mail.subject).toBe(`You are invited to join ${name}'s team on Dewline`);
    expect(mail.raw).toMatch(/as an administrator/);
    const token = /http:\/\/dewline\.test\/invitation\/([A-Za-z0-9_-]{43})/.exec(mail.raw)?.[1];
    expect(token).toBeDefined();

    const anon = await anonymousClient(t.app);
    const invitation = await anon.get(`/api/auth/invitations/${token}`).expect(200);
    expect(invitation.body).toEqual({ email: email.toLowerCase(), name: "Ines Harrow", organisationName: name });
    await anon.post("/api/auth/invitations/accept", { token, password: "a long new password" }).expect(204);

    const admin = await signedInClient(t.app, email, "a long new password");
    const me = await admin.get("/api/auth/me").expect(200);
    expect(me.body).toMatchObject({ role: "admin", organisationId: added.organisationId, name: "Ines Harrow" });

    const policy = await admin.get("/api/policy").expect(200);
    expect(policy.body).toMatchObject({ source: "default" });

    expect((await admin.get("/api/properties").expect(200)).body).toMatchObject({ items: [], total: 0 });
    expect((await admin.get("/api/cases").expect(200)).body).toMatchObject({ items: [], total: 0 });
    const people = await admin.get("/api/users").expect(200);
    expect(people.body.items.map((u: { email: string }) => u.email)).toEqual([email.toLowerCase()]);

    // Another landlord's home, its tenant's account and its cases stay out of sight.
    await admin.get(`/api/properties/${other.home.id}`).expect(404);
    await admin.get(`/api/properties/${other.home.id}/tenants`).expect(404);
    const search = await admin.get(`/api/users?q=${encodeURIComponent(other.tenant.email)}`).expect(200);
    expect(search.body.total).toBe(0);
    // And that landlord's admin does not see the new one's account.
    const theirs = await signedInClient(t.app, other.admin.email, PASSWORD);
    const theirPeople = await theirs.get(`/api/users?q=${encodeURIComponent(email.toLowerCase())}`).expect(200);
    expect(theirPeople.body.total).toBe(0);
  });

  it("refuses a second landlord of the same name (any case, extra spaces) and writes nothing", async () => {
    const name = `Brackenby Homes ${unique()}`;
    await organisations.addLandlord({ name, adminEmail: `a.${unique()}@test.example`, adminName: "Ola Brae" }, onboarding);
    const before = await counts();
    await expect(
      organisations.addLandlord(
        { name: `  ${name.toUpperCase()} `, adminEmail: `b.${unique()}@test.example`, adminName: "Pia Brae" },
        onboarding,
      ),
    ).rejects.toMatchObject({ status: 409, message: expect.stringContaining(`already a landlord called "${name}"`) });
    expect(await counts()).toEqual(before);
  });

  it("refuses an address an account already uses, at any landlord, and writes nothing", async () => {
    const before = await counts();
    await expect(
      organisations.addLandlord(
        { name: `Hollins Lettings ${unique()}`, adminEmail: other.officer.email.toUpperCase(), adminName: "Rue Hollins" },
        onboarding,
      ),
    ).rejects.toMatchObject({ status: 409, message: expect.stringContaining("already used by an account") });
    expect(await counts()).toEqual(before);
  });

  it("refuses a bad e-mail address or a missing name with a message naming it, and writes nothing", async () => {
    const before = await counts();
    await expect(
      organisations.addLandlord(
        { name: `Moss Side ${unique()}`, adminEmail: "not-an-address", adminName: "Sol Moss" },
        onboarding,
      ),
    ).rejects.toMatchObject({ status: 400, message: expect.stringContaining("valid e-mail address") });
    await expect(
      organisations.addLandlord({ name: "   ", adminEmail: `c.${unique()}@test.example`, adminName: "Sol Moss" }, onboarding),
    ).rejects.toMatchObject({ status: 400, message: expect.stringContaining("landlord's name") });
    await expect(
      organisations.addLandlord(
        { name: `Moss Side ${unique()}`, adminEmail: `d.${unique()}@test.example`, adminName: "" },
        onboarding,
      ),
    ).rejects.toMatchObject({ status: 400, message: expect.stringContaining("administrator's name") });
    expect(await counts()).toEqual(before);
  });
});
