// The conversation on a case: the tenant and the landlord's staff write to each other (with e-mails
// both ways), internal notes stay with staff, and each side's unread count moves and resets on reading.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, makeProperty, makeTenant, makeUser, PASSWORD } from "../support/factories.js";
import { png } from "../support/images.js";
import { outboxCount } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

const uploads = mkdtempSync(path.join(tmpdir(), "dewline-test-uploads-"));
let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let secondOfficer: Awaited<ReturnType<typeof makeUser>>;
let tenant: Client;
let officer: Client;
let colleague: Client;
let neighbour: Client;
let outsider: Client;

const report = {
  description: "Mould is spreading along the bathroom ceiling.",
  locations: ["ceiling"],
  observations: ["mould-spots"],
};

interface Message {
  id: number;
  kind: string;
  body: string;
  mine: boolean;
  author: { name: string; role: string } | null;
  photos: { id: number; thumbnailUrl: string }[];
  readBy: { name: string; role: string; readAt: string }[];
}

beforeAll(async () => {
  t = await createTestApp({ UPLOADS_DIR: uploads });
  const ds = t.ctx.dataSource;
  landlord = await makeLandlord(ds);
  secondOfficer = await makeUser(ds, landlord.org, "officer");
  const nextDoor = await makeProperty(ds, landlord.org);
  const neighbourUser = await makeTenant(ds, landlord.org, nextDoor);
  const other = await makeLandlord(ds);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  colleague = await signedInClient(t.app, secondOfficer.email, PASSWORD);
  neighbour = await signedInClient(t.app, neighbourUser.email, PASSWORD);
  outsider = await signedInClient(t.app, other.officer.email, PASSWORD);
});
afterAll(async () => {
  await t.close();
  rmSync(uploads, { recursive: true, force: true });
});

const newCase = async (): Promise<number> => (await tenant.post("/api/cases", report).expect(201)).body.id;
const eventsOf = async (client: Client, caseId: number) =>
  (await client.get(`/api/cases/${caseId}/events`).expect(200)).body.events as { type: string; after: Record<string, unknown> }[];
const conversationOf = async (client: Client, caseId: number) =>
  (await client.get(`/api/cases/${caseId}/messages`).expect(200)).body as {
    messages: Message[];
    unread: number;
    readUpTo: number | null;
  };
const unreadList = async (client: Client) =>
  (await client.get("/api/me/unread-messages").expect(200)).body as {
    items: { caseId: number; unread: number }[];
    total: number;
  };

describe("a tenant writes to the landlord", () => {
  it("answers 201 and shows the message in both sides' timelines and conversations", async () => {
    const caseId = await newCase();
    const res = await tenant.post(`/api/cases/${caseId}/messages`, { body: "The mould is back above the shower." }).expect(201);
    expect(res.body).toEqual({ ok: true, id: expect.any(Number) });

    for (const client of [tenant, officer]) {
      const mine = (await eventsOf(client, caseId)).filter((e) => e.type === "message-from-tenant");
      expect(mine.map((e) => e.after.body)).toEqual(["The mould is back above the shower."]);
    }
    const staffView = await conversationOf(officer, caseId);
    expect(staffView.messages).toEqual([
      expect.objectContaining({
        id: res.body.id,
        kind: "from-tenant",
        body: "The mould is back above the shower.",
        mine: false,
        author: { name: landlord.tenant.name, role: "tenant" },
      }),
    ]);
    expect((await conversationOf(tenant, caseId)).messages[0]).toMatchObject({ kind: "from-tenant", mine: true });
  });

  it("e-mails every officer while nobody is assigned, then only the assignee", async () => {
    const caseId = await newCase();
    await tenant.post(`/api/cases/${caseId}/messages`, { body: "Is anyone coming this week?" }).expect(201);
    for (const email of [landlord.officer.email, secondOfficer.email]) {
      const mail = await t.mail.lastTo(email);
      expect(mail.subject).toMatch(/New message from the tenant/);
      expect(mail.raw).toContain("Is anyone coming this week?");
      expect(mail.raw).toContain(`http://dewline.test/cases/${caseId}`);
    }

    await officer.patch(`/api/cases/${caseId}`, { assigneeId: landlord.officer.id }).expect(200);
    await tenant.post(`/api/cases/${caseId}/messages`, { body: "The window sill is wet every morning." }).expect(201);
    expect((await t.mail.lastTo(landlord.officer.email)).raw).toContain("The window sill is wet every morning.");
    expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "tenantMessage", caseId })).toBe(2);
    expect(await outboxCount(t.ctx.dataSource, { to: secondOfficer.email, template: "tenantMessage", caseId })).toBe(1);
    // Staff see where the e-mails went; the tenant does not.
    const staffEmails = (await eventsOf(officer, caseId)).filter(
      (e) => e.type === "email-queued" && e.after.template === "tenantMessage",
    );
    expect(staffEmails).toHaveLength(3);
    expect((await eventsOf(tenant, caseId)).some((e) => e.type === "email-queued" && e.after.template === "tenantMessage")).toBe(
      false,
    );
  });

  it("carries photos uploaded to the case, and refuses a photo of another case", async () => {
    const caseId = await newCase();
    const otherCaseId = await newCase();
    const upload = async (id: number) =>
      (
        await tenant.agent
          .post(`/api/cases/${id}/photos`)
          .set("X-CSRF-Token", tenant.csrf)
          .attach("photos", await png(320, 240), "ceiling.png")
          .expect(201)
      ).body.photos[0].id as number;
    const photoId = await upload(caseId);
    const foreignPhoto = await upload(otherCaseId);

    await tenant.post(`/api/cases/${caseId}/messages`, { body: "Here it is today.", photoIds: [photoId] }).expect(201);
    const [message] = (await conversationOf(officer, caseId)).messages;
    expect(message!.photos).toEqual([
      { id: photoId, url: `/api/photos/${photoId}`, thumbnailUrl: `/api/photos/${photoId}/thumbnail` },
    ]);
    await officer.get(message!.photos[0]!.thumbnailUrl).expect(200).expect("Content-Type", "image/jpeg");
    expect((await t.mail.lastTo(landlord.officer.email)).raw).toContain("1 photo came with it.");

    const refused = await tenant
      .post(`/api/cases/${caseId}/messages`, { body: "And this one.", photoIds: [foreignPhoto] })
      .expect(400);
    expect(refused.body.error.details[0].field).toBe("photoIds");
    expect((await conversationOf(tenant, caseId)).messages).toHaveLength(1);
  });

  it("refuses `internal` from a tenant, an empty message, and changes nothing", async () => {
    const caseId = await newCase();
    const before = (await eventsOf(officer, caseId)).length;
    for (const internal of [true, false]) {
      const res = await tenant.post(`/api/cases/${caseId}/messages`, { body: "Just between us.", internal }).expect(400);
      expect(res.body.error.details[0]).toMatchObject({ field: "internal", message: expect.stringMatching(/Only staff/) });
    }
    const empty = await tenant.post(`/api/cases/${caseId}/messages`, { body: "   " }).expect(400);
    expect(empty.body.error.details[0]).toMatchObject({ field: "body", message: "Write the message." });
    expect((await eventsOf(officer, caseId)).length).toBe(before);
    expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "tenantMessage", caseId })).toBe(0);
  });

  it("lets a tenant write only on their own case: another home's tenant and another landlord get 404", async () => {
    const caseId = await newCase();
    await neighbour.post(`/api/cases/${caseId}/messages`, { body: "Hello from next door." }).expect(404);
    await neighbour.get(`/api/cases/${caseId}/messages`).expect(404);
    await neighbour.post(`/api/cases/${caseId}/messages/read`, {}).expect(404);
    await outsider.post(`/api/cases/${caseId}/messages`, { body: "Wrong landlord.", internal: false }).expect(404);
    await outsider.get(`/api/cases/${caseId}/messages`).expect(404);
    expect((await conversationOf(officer, caseId)).messages).toEqual([]);
  });
});

describe("staff write to the tenant", () => {
  it("e-mails the tenant a message with a link to the case, and shows it in the tenant's conversation", async () => {
    const caseId = await newCase();
    await officer
      .post(`/api/cases/${caseId}/messages`, { body: "We will call on Thursday morning.", internal: false })
      .expect(201);
    const mail = await t.mail.lastTo(landlord.tenant.email);
    expect(mail.raw).toContain("We will call on Thursday morning.");
    expect(mail.raw).toContain(`http://dewline.test/cases/${caseId}`);
    const { messages } = await conversationOf(tenant, caseId);
    expect(messages).toEqual([
      expect.objectContaining({ kind: "to-tenant", body: "We will call on Thursday morning.", mine: false, readBy: [] }),
    ]);
  });

  it("keeps internal notes from the tenant: not in their events, conversation or e-mails", async () => {
    const caseId = await newCase();
    await officer
      .post(`/api/cases/${caseId}/messages`, { body: "Ask the lead about the loft hatch.", internal: true })
      .expect(201);
    await officer.post(`/api/cases/${caseId}/messages`, { body: "A surveyor is booked.", internal: false }).expect(201);

    const tenantEvents = await tenant.get(`/api/cases/${caseId}/events`).expect(200);
    expect(JSON.stringify(tenantEvents.body)).not.toContain("loft hatch");
    const tenantConversation = await tenant.get(`/api/cases/${caseId}/messages`).expect(200);
    expect(JSON.stringify(tenantConversation.body)).not.toContain("loft hatch");
    expect(tenantConversation.body.messages.map((m: Message) => m.kind)).toEqual(["to-tenant"]);
    expect(t.mail.mails.filter((m) => m.to.includes(landlord.tenant.email)).some((m) => m.raw.includes("loft hatch"))).toBe(
      false,
    );

    const staff = await conversationOf(colleague, caseId);
    expect(staff.messages.map((m) => [m.kind, m.body])).toEqual([
      ["internal-note", "Ask the lead about the loft hatch."],
      ["to-tenant", "A surveyor is booked."],
    ]);
  });
});

describe("unread messages and read receipts", () => {
  it("count the other side's messages until they are read, on the case and in the list of cases", async () => {
    const caseId = await newCase();
    const first = (await tenant.post(`/api/cases/${caseId}/messages`, { body: "First note from me." }).expect(201)).body.id;
    const second = (await tenant.post(`/api/cases/${caseId}/messages`, { body: "Second note from me." }).expect(201)).body.id;

    // The tenant's own messages are never unread to them.
    expect((await conversationOf(tenant, caseId)).unread).toBe(0);
    expect((await conversationOf(officer, caseId)).unread).toBe(2);
    expect((await unreadList(officer)).items).toContainEqual(expect.objectContaining({ caseId, unread: 2 }));

    // Read up to the first message only: the second stays unread.
    expect((await officer.post(`/api/cases/${caseId}/messages/read`, { upTo: first }).expect(200)).body).toEqual({
      unread: 1,
      readUpTo: first,
    });
    expect((await officer.post(`/api/cases/${caseId}/messages/read`, {}).expect(200)).body).toEqual({
      unread: 0,
      readUpTo: second,
    });
    expect((await unreadList(officer)).items.map((i) => i.caseId)).not.toContain(caseId);
    // Each officer has their own mark.
    expect((await conversationOf(colleague, caseId)).unread).toBe(2);
    // A mark never moves back.
    await officer.post(`/api/cases/${caseId}/messages/read`, { upTo: first }).expect(200);
    expect((await conversationOf(officer, caseId)).unread).toBe(0);

    await officer.post(`/api/cases/${caseId}/messages`, { body: "Thank you, noted.", internal: false }).expect(201);
    await officer.post(`/api/cases/${caseId}/messages`, { body: "Internal: chase the fan.", internal: true }).expect(201);
    expect((await conversationOf(tenant, caseId)).unread).toBe(1);
    // The tenant's other reports (earlier tests) have unread messages too; the total counts them all.
    const tenantList = await unreadList(tenant);
    expect(tenantList.items).toContainEqual(expect.objectContaining({ caseId, unread: 1 }));
    expect(tenantList.total).toBe(tenantList.items.reduce((n, i) => n + i.unread, 0));
    // Staff do not count each other's messages and notes as unread.
    expect((await conversationOf(colleague, caseId)).unread).toBe(2);

    await tenant.post(`/api/cases/${caseId}/messages/read`, {}).expect(200);
    expect((await conversationOf(tenant, caseId)).unread).toBe(0);
    const after = await unreadList(tenant);
    expect(after.items.map((i) => i.caseId)).not.toContain(caseId);
    expect(after.total).toBe(tenantList.total - 1);
  });

  it("tell staff who has read what, and never show read receipts to the tenant", async () => {
    const caseId = await newCase();
    await officer.post(`/api/cases/${caseId}/messages`, { body: "Can you send a photo?", internal: false }).expect(201);
    let staffView = await conversationOf(officer, caseId);
    expect(staffView.messages[0]!.readBy).toEqual([]);

    await tenant.post(`/api/cases/${caseId}/messages/read`, {}).expect(200);
    await tenant.post(`/api/cases/${caseId}/messages`, { body: "Sending one tonight." }).expect(201);
    await colleague.post(`/api/cases/${caseId}/messages/read`, {}).expect(200);

    staffView = await conversationOf(officer, caseId);
    const [toTenant, fromTenant] = staffView.messages;
    expect(toTenant!.readBy).toEqual([{ name: landlord.tenant.name, role: "tenant", readAt: expect.any(String) }]);
    expect(fromTenant!.readBy).toEqual([{ name: secondOfficer.name, role: "officer", readAt: expect.any(String) }]);
    expect((await conversationOf(tenant, caseId)).messages.every((m) => m.readBy.length === 0)).toBe(true);
  });

  it("refuses a mark that is not a message id", async () => {
    const caseId = await newCase();
    const res = await officer.post(`/api/cases/${caseId}/messages/read`, { upTo: "latest" }).expect(400);
    expect(res.body.error.details[0].field).toBe("upTo");
  });
});
