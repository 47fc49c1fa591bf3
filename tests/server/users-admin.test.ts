// An admin manages people: name and role, invitations sent again or cancelled, accounts disabled and
// enabled again, each written to the account's history; other landlords' people are not found.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Tenancy } from "../../server/modules/tenancies/tenancy.entity.js";
import { UserAuditEntry } from "../../server/modules/users/user-audit.entity.js";
import { User } from "../../server/modules/users/user.entity.js";
import { makeLandlord, makeUser, PASSWORD } from "../support/factories.js";
import { outboxRows } from "../support/outbox.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let admin: Client;

const linkIn = (raw: string) => {
  const match = /http:\/\/dewline\.test\/invitation\/([A-Za-z0-9_-]{43})/.exec(raw);
  if (!match) throw new Error("no invitation link in e-mail");
  return match[1]!;
};
const mailsTo = (address: string) => t.mail.mails.filter((m) => m.to.includes(address));
const audit = (targetUserId: number) =>
  t.ctx.dataSource.getRepository(UserAuditEntry).find({ where: { targetUserId }, order: { id: "ASC" } });
const storedSessions = async (userId: number) => {
  const rows = (await t.ctx.dataSource.query(
    "SELECT COUNT(*) AS n FROM sessions WHERE COALESCE(JSON_VALUE(data, '$.passport.user.id'), JSON_VALUE(data, '$.passport.user')) = ?",
    [String(userId)],
  )) as [{ n: string | number }];
  return Number(rows[0].n);
};
const userRow = (id: number) => t.ctx.dataSource.getRepository(User).findOneByOrFail({ id });

async function invite(role: "officer" | "maintenance" | "admin" | "tenant", extra: object = {}) {
  const email = `invitee.${role}.${Math.random().toString(36).slice(2, 10)}@test.example`;
  await admin.post("/api/auth/invitations", { email, name: "Ola Penrith", role, ...extra }).expect(201);
  const mail = await t.mail.lastTo(email);
  const { id: userId } = await t.ctx.dataSource.getRepository(User).findOneByOrFail({ email });
  return { email, userId, mail, token: linkIn(mail.raw) };
}

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  other = await makeLandlord(t.ctx.dataSource);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
});
afterAll(() => t.close());

describe("staff and tenant invitations have their own wording", () => {
  it("tells staff they join the landlord's team, never about damp 'in your home'; a tenant's keeps its own", async () => {
    const staff = await invite("maintenance");
    expect(staff.mail.raw).toContain(`added you to ${landlord.org.name}'s team on Dewline, as a maintenance lead`);
    expect(staff.mail.raw).not.toMatch(/your home/i);
    const [row] = await outboxRows(t.ctx.dataSource, { to: staff.email });
    expect(row).toMatchObject({ template: "staffInvitation", status: "sent" });

    const tenant = await invite("tenant", { propertyId: landlord.home.id });
    expect(tenant.mail.raw).toContain("in your home");
    expect((await outboxRows(t.ctx.dataSource, { to: tenant.email }))[0]).toMatchObject({ template: "invitation" });
  });
});

describe("editing name and role", () => {
  it("changes a staff member's name and role, writes who did it, and the new role applies from their next sign-in", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "maintenance", { name: "Kit Harrow" });
    const session = await signedInClient(t.app, person.email, PASSWORD);
    await session.get("/api/cases").expect(200);

    const res = await admin.patch(`/api/users/${person.id}`, { name: "  Kit Harrow-Lane ", role: "officer" }).expect(200);
    expect(res.body).toMatchObject({ id: person.id, name: "Kit Harrow-Lane", role: "officer", status: "active" });
    expect(await userRow(person.id)).toMatchObject({ name: "Kit Harrow-Lane", role: "officer" });
    // A role change signs the person out everywhere (tests/server/sessions.test.ts); they sign in to the new role.
    await session.get("/api/auth/me").expect(401);
    const again = await signedInClient(t.app, person.email, PASSWORD);
    expect((await again.get("/api/auth/me").expect(200)).body).toMatchObject({ role: "officer", name: "Kit Harrow-Lane" });

    const entries = await audit(person.id);
    expect(entries.map((e) => [e.action, e.fromValue, e.toValue, e.actorUserId])).toEqual([
      ["name-changed", "Kit Harrow", "Kit Harrow-Lane", landlord.admin.id],
      ["role-changed", "maintenance", "officer", landlord.admin.id],
    ]);
    const history = await admin.get(`/api/users/${person.id}/history`).expect(200);
    expect(history.body.entries[0]).toMatchObject({
      action: "role-changed",
      from: "maintenance",
      to: "officer",
      actor: { id: landlord.admin.id, name: landlord.admin.name },
    });
    expect(Date.parse(history.body.entries[0].at)).not.toBeNaN();

    // Sending what is already there changes and records nothing.
    await admin.patch(`/api/users/${person.id}`, { name: "Kit Harrow-Lane", role: "officer" }).expect(200);
    expect(await audit(person.id)).toHaveLength(2);
  });

  it("refuses bad input, tenant↔staff moves and another landlord's people, changing nothing", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer", { name: "Ren Sallow" });
    await admin.patch(`/api/users/${person.id}`, {}).expect(400);
    const blank = await admin.patch(`/api/users/${person.id}`, { name: "   " }).expect(400);
    expect(blank.body.error.details[0].field).toBe("name");
    await admin.patch(`/api/users/${person.id}`, { role: "superuser" }).expect(400);
    await admin.patch(`/api/users/${person.id}`, { role: "officer", email: "x@test.example" }).expect(400);

    const toTenant = await admin.patch(`/api/users/${person.id}`, { role: "tenant" }).expect(409);
    expect(toTenant.body.error.message).toMatch(/staff account cannot be made a tenant's/);
    const toStaff = await admin.patch(`/api/users/${landlord.tenant.id}`, { role: "officer" }).expect(409);
    expect(toStaff.body.error.message).toMatch(/tenant's account cannot be given a staff role/);

    await admin.patch(`/api/users/${other.officer.id}`, { name: "Taken Over" }).expect(404);
    await admin.get(`/api/users/${other.officer.id}/history`).expect(404);
    await admin.post(`/api/auth/invitations/${other.officer.id}/resend`).expect(404);
    await admin.post(`/api/auth/invitations/${other.officer.id}/cancel`).expect(404);

    expect(await userRow(person.id)).toMatchObject({ name: "Ren Sallow", role: "officer" });
    expect(await userRow(other.officer.id)).toMatchObject({ name: other.officer.name, role: "officer" });
    expect(await audit(person.id)).toHaveLength(0);
    expect(await audit(other.officer.id)).toHaveLength(0);
  });
});

describe("the landlord always keeps an administrator", () => {
  it("stops an admin demoting or disabling themselves, and the last admin being demoted or disabled", async () => {
    const org = await makeLandlord(t.ctx.dataSource);
    const soleAdmin = await signedInClient(t.app, org.admin.email, PASSWORD);

    const demoteSelf = await soleAdmin.patch(`/api/users/${org.admin.id}`, { role: "officer" }).expect(409);
    expect(demoteSelf.body.error.message).toMatch(/cannot change your own role/);
    const disableSelf = await soleAdmin.patch(`/api/users/${org.admin.id}`, { status: "disabled" }).expect(409);
    expect(disableSelf.body.error.message).toMatch(/cannot disable or enable your own account/);
    // Their own name is theirs to correct.
    await soleAdmin.patch(`/api/users/${org.admin.id}`, { name: "Sole Admin" }).expect(200);

    // A second admin joins; the first may now be demoted by the second, but then the second is the last one.
    const second = await makeUser(t.ctx.dataSource, org.org, "admin");
    const secondClient = await signedInClient(t.app, second.email, PASSWORD);
    await secondClient.patch(`/api/users/${org.admin.id}`, { role: "officer" }).expect(200);
    // The demoted admin is signed out at once, and refused admin routes when back in.
    await soleAdmin.get("/api/users").expect(401);
    await (await signedInClient(t.app, org.admin.email, PASSWORD)).get("/api/users").expect(403);

    // Now the second admin is the only active one. Only a race could reach this rule through the API (an
    // admin cannot change themselves), so ask the service as another, disabled admin would.
    const third = await makeUser(t.ctx.dataSource, org.org, "admin", { status: "disabled" });
    const asThird = { id: third.id, email: third.email, name: third.name, role: "admin" as const, organisationId: org.org.id };
    for (const change of [{ role: "maintenance" as const }, { status: "disabled" as const }]) {
      const refused = await t.ctx.services.users.update(asThird, second.id, change).catch((e: unknown) => e);
      expect(refused).toMatchObject({ status: 409, message: expect.stringMatching(/only active administrator/) });
    }
    expect(await userRow(second.id)).toMatchObject({ role: "admin", status: "active" });
    expect((await audit(second.id)).length).toBe(0);
  });
});

describe("invitations sent again and cancelled", () => {
  it("sends a pending invitation again with a new link; the old link stops working", async () => {
    const first = await invite("officer");
    const res = await admin.post(`/api/auth/invitations/${first.userId}/resend`).expect(201);
    expect(res.body.userId).toBe(first.userId);
    // A fresh 72 hours from now (the app's clock).
    expect(Date.parse(res.body.expiresAt)).toBeGreaterThan(hoursAgo(-71).getTime());
    await expect.poll(() => mailsTo(first.email).length).toBe(2);
    const again = mailsTo(first.email).at(-1)!;
    expect(again.raw).toContain("team on Dewline, as a housing officer");
    const newToken = linkIn(again.raw);
    expect(newToken).not.toBe(first.token);

    const anon = await anonymousClient(t.app);
    await anon.get(`/api/auth/invitations/${first.token}`).expect(404);
    await anon.post("/api/auth/invitations/accept", { token: first.token, password: "a new long password" }).expect(404);
    await anon.post("/api/auth/invitations/accept", { token: newToken, password: "a new long password" }).expect(204);
    await signedInClient(t.app, first.email, "a new long password");

    expect((await audit(first.userId)).map((e) => e.action)).toEqual(["invited", "invitation-resent", "invitation-accepted"]);
    // Accepted: nothing left to send or cancel.
    const done = await admin.post(`/api/auth/invitations/${first.userId}/resend`).expect(409);
    expect(done.body.error.message).toMatch(/already accepted/);
    await admin.post(`/api/auth/invitations/${first.userId}/cancel`).expect(409);
  });

  it("cancels an invitation: the link stops working, the account is marked cancelled, a tenant's tenancy goes", async () => {
    const tenant = await invite("tenant", { propertyId: landlord.home.id });
    expect(await t.ctx.dataSource.getRepository(Tenancy).countBy({ tenantUserId: tenant.userId })).toBe(1);

    await admin.post(`/api/auth/invitations/${tenant.userId}/cancel`).expect(204);
    expect(await userRow(tenant.userId)).toMatchObject({ status: "cancelled" });
    expect(await t.ctx.dataSource.getRepository(Tenancy).countBy({ tenantUserId: tenant.userId })).toBe(0);
    const anon = await anonymousClient(t.app);
    await anon.get(`/api/auth/invitations/${tenant.token}`).expect(404);
    await anon.post("/api/auth/invitations/accept", { token: tenant.token, password: "a new long password" }).expect(404);
    await expect(signedInClient(t.app, tenant.email, "a new long password")).rejects.toThrow(/401/);

    const list = await admin.get(`/api/users?q=${encodeURIComponent(tenant.email)}`).expect(200);
    expect(list.body.items).toEqual([expect.objectContaining({ id: tenant.userId, status: "cancelled" })]);
    await admin.post(`/api/auth/invitations/${tenant.userId}/resend`).expect(409);
    await admin.patch(`/api/users/${tenant.userId}`, { name: "Other Name" }).expect(409);
    expect((await audit(tenant.userId)).map((e) => e.action)).toEqual(["invited", "invitation-cancelled"]);

    // The same address can be invited again later, as staff this time.
    await admin.post("/api/auth/invitations", { email: tenant.email, name: "Ola Again", role: "officer" }).expect(201);
    expect(await userRow(tenant.userId)).toMatchObject({ status: "invited", role: "officer", name: "Ola Again" });
  });
});

describe("disabling and enabling an account", () => {
  it("ends a disabled person's sessions at once and stops them signing in; enabling lets them back", async () => {
    const person = await makeUser(t.ctx.dataSource, landlord.org, "officer");
    const session = await signedInClient(t.app, person.email, PASSWORD);
    await session.get("/api/cases").expect(200);
    expect(await storedSessions(person.id)).toBeGreaterThan(0);

    await admin.patch(`/api/users/${person.id}`, { status: "disabled" }).expect(200);
    await session.get("/api/cases").expect(401);
    await session.get("/api/auth/me").expect(401);
    expect(await storedSessions(person.id)).toBe(0);
    await expect(signedInClient(t.app, person.email, PASSWORD)).rejects.toThrow(/401/);

    await admin.patch(`/api/users/${person.id}`, { status: "active" }).expect(200);
    const back = await signedInClient(t.app, person.email, PASSWORD);
    await back.get("/api/cases").expect(200);
    expect((await audit(person.id)).map((e) => [e.action, e.actorUserId])).toEqual([
      ["disabled", landlord.admin.id],
      ["enabled", landlord.admin.id],
    ]);
  });

  it("refuses disabling someone who has not accepted their invitation", async () => {
    const pending = await invite("maintenance");
    const res = await admin.patch(`/api/users/${pending.userId}`, { status: "disabled" }).expect(409);
    expect(res.body.error.message).toMatch(/not accepted their invitation/);
  });
});

describe("only admins manage people", () => {
  it("answers 403 to officers, maintenance leads and tenants, changing nothing", async () => {
    const target = await makeUser(t.ctx.dataSource, landlord.org, "maintenance", { name: "Untouched" });
    const pending = await invite("officer");
    for (const who of [landlord.officer, landlord.maintenance, landlord.tenant]) {
      const c = await signedInClient(t.app, who.email, PASSWORD);
      await c.patch(`/api/users/${target.id}`, { name: "Changed" }).expect(403);
      await c.patch(`/api/users/${target.id}`, { status: "disabled" }).expect(403);
      await c.get(`/api/users/${target.id}/history`).expect(403);
      await c.post(`/api/auth/invitations/${pending.userId}/resend`).expect(403);
      await c.post(`/api/auth/invitations/${pending.userId}/cancel`).expect(403);
    }
    expect(await userRow(target.id)).toMatchObject({ name: "Untouched", status: "active" });
    expect(await userRow(pending.userId)).toMatchObject({ status: "invited" });
    expect(mailsTo(pending.email)).toHaveLength(1);
    expect(await audit(target.id)).toHaveLength(0);
  });
});
