import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { UserToken } from "../../server/modules/auth/user-token.entity.js";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { User } from "../../server/modules/users/user.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { mailSettled, outboxCount } from "../support/outbox.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let admin: Client;

const linkIn = (raw: string, path: string) => {
  const match = new RegExp(`http://dewline\\.test/${path}/([A-Za-z0-9_-]{43})`).exec(raw);
  if (!match) throw new Error(`no ${path} link in e-mail`);
  return match[1]!;
};

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  other = await makeLandlord(t.ctx.dataSource);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
});
afterAll(() => t.close());

/** The invited account's id (the invitation's answer does not tell it: see "another landlord" below). */
const idOf = async (email: string, ds = t.ctx.dataSource) => (await ds.getRepository(User).findOneByOrFail({ email })).id;

describe("invitations", () => {
  it("invites staff by e-mail; the single-use link sets a password and the person can sign in", async () => {
    const email = `new.officer.${Date.now()}@test.example`;
    await admin.post("/api/auth/invitations", { email, name: "Nia Quell", role: "officer" }).expect(201);
    const userId = await idOf(email);
    const mail = await t.mail.lastTo(email);
    expect(mail.subject).toContain("invited");
    const token = linkIn(mail.raw, "invitation");

    const outbox = await t.ctx.dataSource.getRepository(OutboxEmail).findOneByOrFail({ relatedType: "user", relatedId: userId });
    // Staff get the staff wording (tests/server/users-admin.test.ts reads it).
    expect(outbox).toMatchObject({
      toAddress: email,
      template: "staffInvitation",
      status: "sent",
      organisationId: landlord.org.id,
    });
    // Only the hash is stored.
    const stored = await t.ctx.dataSource.getRepository(UserToken).findOneByOrFail({ userId });
    expect(stored.tokenHash).not.toContain(token);

    const anon = await anonymousClient(t.app);
    const info = await anon.get(`/api/auth/invitations/${token}`).expect(200);
    expect(info.body).toEqual({ email, name: "Nia Quell", organisationName: landlord.org.name });
    await expect(signedInClient(t.app, email, "a new long password")).rejects.toThrow(/401/);

    await anon.post("/api/auth/invitations/accept", { token, password: "short" }).expect(400);
    await anon.post("/api/auth/invitations/accept", { token, password: "a new long password" }).expect(204);
    const again = await anon.post("/api/auth/invitations/accept", { token, password: "another long password" }).expect(404);
    expect(again.body.error.message).toMatch(/used already or have expired/);

    const me = await (await signedInClient(t.app, email, "a new long password")).get("/api/auth/me").expect(200);
    expect(me.body).toMatchObject({ role: "officer", organisationId: landlord.org.id });
  });

  it("refuses an expired invitation link", async () => {
    const email = `late.${Date.now()}@test.example`;
    await admin.post("/api/auth/invitations", { email, name: "Late Comer", role: "maintenance" }).expect(201);
    const token = linkIn((await t.mail.lastTo(email)).raw, "invitation");
    await t.ctx.dataSource.getRepository(UserToken).update({ userId: await idOf(email) }, { expiresAt: msAgo(1000) });
    const anon = await anonymousClient(t.app);
    await anon.post("/api/auth/invitations/accept", { token, password: "a new long password" }).expect(404);
  });

  it("lets an officer invite a tenant to one of their homes, creating the tenancy", async () => {
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const email = `new.tenant.${Date.now()}@test.example`;
    await officer
      .post("/api/auth/invitations", {
        email,
        name: "Ari Brook",
        role: "tenant",
        propertyId: landlord.home.id,
        householdNotes: "Baby due in spring.",
      })
      .expect(201);
    const tenancy = await t.ctx.dataSource.getRepository(Tenancy).findOneByOrFail({ tenantUserId: await idOf(email) });
    expect(tenancy).toMatchObject({ propertyId: landlord.home.id, endDate: null, householdNotes: "Baby due in spring." });
  });

  it("stops officers inviting staff, tenants needing a home, other landlords' homes and duplicate e-mails, changing nothing", async () => {
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const users = t.ctx.dataSource.getRepository(User);
    const before = await users.count();
    await officer.post("/api/auth/invitations", { email: "x1@test.example", name: "X", role: "admin" }).expect(403);
    const noHome = await admin.post("/api/auth/invitations", { email: "x2@test.example", name: "X", role: "tenant" }).expect(400);
    expect(noHome.body.error.details[0].field).toBe("propertyId");
    await admin
      .post("/api/auth/invitations", { email: "x3@test.example", name: "X", role: "tenant", propertyId: other.home.id })
      .expect(404);
    const ours = await admin.post("/api/auth/invitations", { email: landlord.officer.email, name: "X", role: "officer" });
    expect(ours.status).toBe(409);
    expect(ours.body.error.message).toMatch(/already uses that address at your organisation/);
    await admin.post("/api/auth/invitations", { email: "x4@test.example", name: "X", role: "superuser" }).expect(400);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    await tenant
      .post("/api/auth/invitations", { email: "x5@test.example", name: "X", role: "tenant", propertyId: landlord.home.id })
      .expect(403);
    expect(await users.count()).toBe(before);
  });

  it("keeps the invitation and its e-mail when the mail server is down, to be sent again later", async () => {
    const broken = await createTestApp({ SMTP_PORT: "9" });
    try {
      const client = await signedInClient(broken.app, landlord.admin.email, PASSWORD);
      const email = `unsent.${Date.now()}@test.example`;
      await client.post("/api/auth/invitations", { email, name: "Un Sent", role: "officer" }).expect(201);
      await mailSettled(broken);
      const repo = broken.ctx.dataSource.getRepository(OutboxEmail);
      const row = await repo.findOneByOrFail({ relatedType: "user", relatedId: await idOf(email, broken.ctx.dataSource) });
      // Waiting for its next attempt (tests/server/outbox.test.ts follows it through to delivery).
      expect(row).toMatchObject({ status: "pending", attempts: 1 });
      expect(row.error).toBeTruthy();
      expect(row.nextAttemptAt).not.toBeNull();
      await repo.update(row.id, { status: "failed" });
    } finally {
      await broken.close();
    }
  });
});

describe("inviting an address that already has an account with another landlord", () => {
  it("answers exactly as for a new address, changes nothing, and tells the address's owner instead", async () => {
    const fresh = `fresh.${Date.now()}@test.example`;
    const created = await admin.post("/api/auth/invitations", { email: fresh, name: "Pat Fresh", role: "officer" }).expect(201);
    const taken = await admin
      .post("/api/auth/invitations", { email: other.maintenance.email, name: "Pat Taken", role: "officer" })
      .expect(201);
    expect(Object.keys(taken.body).sort()).toEqual(Object.keys(created.body).sort());
    expect(taken.body.userId).toBeUndefined();
    expect(taken.headers["content-length"]).toBe(created.headers["content-length"]);

    const row = await t.ctx.dataSource.getRepository(User).findOneByOrFail({ email: other.maintenance.email });
    expect(row).toMatchObject({
      organisationId: other.org.id,
      name: other.maintenance.name,
      role: "maintenance",
      status: "active",
    });
    const mail = await t.mail.lastTo(other.maintenance.email);
    expect(mail.raw).toContain(landlord.org.name);
    expect(mail.raw).toMatch(/already has a Dewline account/);
    expect(mail.raw).not.toContain(other.org.name);
    expect(mail.raw).not.toMatch(/invitation\/[A-Za-z0-9_-]{43}/);
    // The other landlord's person still signs in as before.
    await signedInClient(t.app, other.maintenance.email, PASSWORD);
  });
});

describe("password reset", () => {
  it("answers before doing any work for the account, so its timing says nothing about whether the account exists", async () => {
    // Hold the account's row: any work for it (the link, the e-mail) would wait behind this lock.
    const runner = t.ctx.dataSource.createQueryRunner();
    await runner.startTransaction();
    try {
      await runner.query("SELECT id FROM users WHERE id = ? FOR UPDATE", [landlord.officer.id]);
      const anon = await anonymousClient(t.app);
      const known = await anon.post("/api/auth/password-reset", { email: landlord.officer.email }).timeout(8000).expect(202);
      const unknown = await anon.post("/api/auth/password-reset", { email: "nobody.else@test.example" }).expect(202);
      expect(known.body).toEqual(unknown.body);
      expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "passwordReset" })).toBe(0);
    } finally {
      await runner.commitTransaction();
      await runner.release();
    }
    await t.ctx.services.auth.settled();
    expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "passwordReset" })).toBe(1);
    expect(await outboxCount(t.ctx.dataSource, { to: "nobody.else@test.example" })).toBe(0);
  });

  it("e-mails a single-use link that sets a new password; the old one stops working", async () => {
    const anon = await anonymousClient(t.app);
    const res = await anon.post("/api/auth/password-reset", { email: landlord.maintenance.email }).expect(202);
    expect(res.body.message).toMatch(/If an active account/);
    await t.ctx.services.auth.settled();
    const token = linkIn((await t.mail.lastTo(landlord.maintenance.email)).raw, "reset-password");
    await anon.post("/api/auth/password-reset/confirm", { token, password: "brand new password 1" }).expect(204);
    await anon.post("/api/auth/password-reset/confirm", { token, password: "brand new password 2" }).expect(404);
    await expect(signedInClient(t.app, landlord.maintenance.email, PASSWORD)).rejects.toThrow(/401/);
    await signedInClient(t.app, landlord.maintenance.email, "brand new password 1");
  });

  it("answers the same for an unknown address and sends nothing", async () => {
    const anon = await anonymousClient(t.app);
    const res = await anon.post("/api/auth/password-reset", { email: "nobody.here@test.example" }).expect(202);
    expect(res.body.message).toMatch(/If an active account/);
    // Once the work behind the reply has finished, there is no outbox row.
    await t.ctx.services.auth.settled();
    expect(await outboxCount(t.ctx.dataSource, { to: "nobody.here@test.example" })).toBe(0);
  });
});
