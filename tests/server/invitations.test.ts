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

describe("invitations", () => {
  it("invites staff by e-mail; the single-use link sets a password and the person can sign in", async () => {
    const email = `new.officer.${Date.now()}@test.example`;
    const res = await admin.post("/api/auth/invitations", { email, name: "Nia Quell", role: "officer" }).expect(201);
    const mail = await t.mail.lastTo(email);
    expect(mail.subject).toContain("invited");
    const token = linkIn(mail.raw, "invitation");

    const outbox = await t.ctx.dataSource
      .getRepository(OutboxEmail)
      .findOneByOrFail({ relatedType: "user", relatedId: res.body.userId });
    // Staff get the staff wording (tests/server/users-admin.test.ts reads it).
    expect(outbox).toMatchObject({
      toAddress: email,
      template: "staffInvitation",
      status: "sent",
      organisationId: landlord.org.id,
    });
    // Only the hash is stored.
    const stored = await t.ctx.dataSource.getRepository(UserToken).findOneByOrFail({ userId: res.body.userId });
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
    const res = await admin.post("/api/auth/invitations", { email, name: "Late Comer", role: "maintenance" }).expect(201);
    const token = linkIn((await t.mail.lastTo(email)).raw, "invitation");
    await t.ctx.dataSource.getRepository(UserToken).update({ userId: res.body.userId }, { expiresAt: msAgo(1000) });
    const anon = await anonymousClient(t.app);
    await anon.post("/api/auth/invitations/accept", { token, password: "a new long password" }).expect(404);
  });

  it("lets an officer invite a tenant to one of their homes, creating the tenancy", async () => {
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const email = `new.tenant.${Date.now()}@test.example`;
    const res = await officer
      .post("/api/auth/invitations", {
        email,
        name: "Ari Brook",
        role: "tenant",
        propertyId: landlord.home.id,
        householdNotes: "Baby due in spring.",
      })
      .expect(201);
    const tenancy = await t.ctx.dataSource.getRepository(Tenancy).findOneByOrFail({ tenantUserId: res.body.userId });
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
    await admin.post("/api/auth/invitations", { email: landlord.officer.email, name: "X", role: "officer" }).expect(409);
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
      const res = await client.post("/api/auth/invitations", { email, name: "Un Sent", role: "officer" }).expect(201);
      await mailSettled(broken);
      const repo = broken.ctx.dataSource.getRepository(OutboxEmail);
      const row = await repo.findOneByOrFail({ relatedType: "user", relatedId: res.body.userId });
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

describe("password reset", () => {
  it("e-mails a single-use link that sets a new password; the old one stops working", async () => {
    const anon = await anonymousClient(t.app);
    const res = await anon.post("/api/auth/password-reset", { email: landlord.maintenance.email }).expect(202);
    expect(res.body.message).toMatch(/If an active account/);
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
    // The reply came after the outbox row would have been written: there is none.
    expect(await outboxCount(t.ctx.dataSource, { to: "nobody.here@test.example" })).toBe(0);
  });
});
