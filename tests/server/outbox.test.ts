// The outbox: every e-mail is stored whole with the change it is about, and a relay sends it. The
// request never waits on the mail server; a mail-server outage, a hanging mail server or a crash
// loses nothing and sends nothing twice (SMTP itself cannot promise exactly-once: the relay's
// Message-ID per outbox row is the key a receiver, and these tests, de-duplicate by).
import { pino } from "pino";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createMailer } from "../../server/lib/mailer.js";
import { MailRelay } from "../../server/modules/mail/mail.relay.js";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { startHangingSmtp, startMailCatcher } from "../support/mail-catcher.js";
import { mailSettled, outboxRows } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

const logger = pino({ level: "silent" });
const report = {
  description: "Water runs down the bedroom window every morning.",
  locations: ["window"],
  observations: ["condensation"],
};
/** A clock `ms` ahead of the tests' clock: the relay's backoff has passed by then. */
const later = (ms: number) => ({ now: () => new Date(testClock.now().getTime() + ms) });
const HOUR = 3_600_000;

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  other = await makeLandlord(t.ctx.dataSource);
});
afterAll(async () => {
  // Nothing of ours is left for a later test file's relay to find.
  await t.ctx.dataSource.getRepository(OutboxEmail).update({ status: "pending" }, { status: "failed" });
  await t.close();
});

const rowOf = (id: number) => t.ctx.dataSource.getRepository(OutboxEmail).findOneByOrFail({ id });
const ackOf = async (caseId: number) =>
  t.ctx.dataSource
    .getRepository(OutboxEmail)
    .findOneByOrFail({ relatedType: "case", relatedId: caseId, template: "caseAcknowledgement" });
const copiesOf = (catcher: { mails: { messageId: string }[] }, messageId: string | null) =>
  catcher.mails.filter((m) => m.messageId === messageId).length;

/** Queues one e-mail with nothing after the commit, as a crash right after it would leave it. */
async function queuedOnly(to: string, template: "fixConfirmed" | "appointmentCancelled" = "fixConfirmed", text = "") {
  const data =
    template === "fixConfirmed"
      ? { name: `Pat ${text}`, reference: "DW-2026-00001", link: "http://dewline.test/cases/1" }
      : {
          name: "Pat",
          reference: "DW-2026-00002",
          workType: "mould-wash",
          slot: { date: "2026-12-07", window: "am" },
          address: "1 Test Street",
          reason: `Operative ill <b>${text}</b>`,
          link: "http://dewline.test/cases/2",
          ics: "BEGIN:VCALENDAR\r\nMETHOD:CANCEL\r\nEND:VCALENDAR\r\n",
        };
  const { outboxId } = await t.ctx.dataSource.transaction((m) =>
    t.ctx.services.mail.enqueueWithId(m, { to, template, data, organisationId: landlord.org.id } as never),
  );
  return outboxId;
}

describe("a mail-server outage", () => {
  it("answers the report at once, keeps the e-mail, and delivers exactly one copy when the server is back", async () => {
    const catcher = await startMailCatcher();
    const app = await createTestApp({ SMTP_PORT: String(catcher.port) });
    try {
      const tenant = await signedInClient(app.app, landlord.tenant.email, PASSWORD);
      await catcher.stop();
      const res = await tenant.post("/api/cases", report).expect(201);
      await mailSettled(app);
      const queued = await ackOf(res.body.id);
      expect(queued).toMatchObject({ status: "pending", attempts: 1, toAddress: landlord.tenant.email });
      expect(queued.error).toMatch(/ECONNREFUSED/);
      expect(queued.nextAttemptAt!.getTime()).toBeGreaterThan(testClock.now().getTime());
      expect(queued.textBody).toContain(res.body.reference);

      // Still down at the next attempt: one more attempt, a longer wait.
      await new MailRelay(app.ctx.dataSource, app.ctx.mailer, logger, later(HOUR)).drain();
      const again = await rowOf(queued.id);
      expect(again).toMatchObject({ status: "pending", attempts: 2 });
      expect(again.nextAttemptAt!.getTime() - (testClock.now().getTime() + HOUR)).toBeGreaterThan(
        queued.nextAttemptAt!.getTime() - testClock.now().getTime(),
      );

      await catcher.start();
      // Not due yet for the app's own relay: nothing goes before the backoff has passed.
      app.ctx.services.mail.relay.wake();
      await mailSettled(app);
      expect(copiesOf(catcher, queued.messageId)).toBe(0);

      const relay = new MailRelay(app.ctx.dataSource, app.ctx.mailer, logger, later(3 * HOUR));
      await relay.drain();
      await relay.drain();
      expect(copiesOf(catcher, queued.messageId)).toBe(1);
      expect(catcher.mails.find((m) => m.messageId === queued.messageId)!.subject).toContain(res.body.reference);
      expect(await rowOf(queued.id)).toMatchObject({ status: "sent", attempts: 3, error: null });
    } finally {
      await app.close();
      await catcher.close();
    }
  });

  it("does not hold the request while the mail server accepts the connection and never answers", async () => {
    const hanging = await startHangingSmtp();
    const app = await createTestApp({ SMTP_PORT: String(hanging.port), SMTP_GREETING_TIMEOUT_MS: "600000" });
    try {
      const tenant = await signedInClient(app.app, landlord.tenant.email, PASSWORD);
      const res = await tenant.post("/api/cases", report).expect(201);
      // The answer came while the relay is still waiting for the server's greeting.
      await expect.poll(() => hanging.accepted).toBe(1);
      expect((await ackOf(res.body.id)).status).toBe("sending");
      await hanging.close();
      await mailSettled(app);
      expect(await ackOf(res.body.id)).toMatchObject({ status: "pending", attempts: 1 });
    } finally {
      await app.close();
      await hanging.close();
    }
  });

  it("gives up on a silent mail server after the configured greeting timeout and tries again later", async () => {
    const hanging = await startHangingSmtp();
    const app = await createTestApp({ SMTP_PORT: String(hanging.port), SMTP_GREETING_TIMEOUT_MS: "200" });
    try {
      const tenant = await signedInClient(app.app, landlord.tenant.email, PASSWORD);
      const res = await tenant.post("/api/cases", report).expect(201);
      await mailSettled(app);
      const row = await ackOf(res.body.id);
      expect(row).toMatchObject({ status: "pending", attempts: 1 });
      expect(row.error).toMatch(/greeting/i);
    } finally {
      await app.close();
      await hanging.close();
    }
  });
});

describe("after a crash", () => {
  it("sends at relay start what was left pending, and what was left sending once its lease has run out", async () => {
    const to = `crash.${Date.now()}@test.example`;
    const pending = await queuedOnly(to);
    const stuck = await queuedOnly(to);
    const leased = await queuedOnly(to);
    const repo = t.ctx.dataSource.getRepository(OutboxEmail);
    // One relay died holding two rows: one lease has run out, the other (another instance's, still alive) has not.
    await repo.update(stuck, {
      status: "sending",
      attempts: 1,
      leaseToken: "dead",
      leaseExpiresAt: new Date(testClock.now().getTime() - 1000),
    });
    await repo.update(leased, {
      status: "sending",
      attempts: 1,
      leaseToken: "alive",
      leaseExpiresAt: new Date(testClock.now().getTime() + HOUR),
    });
    const stuckRow = await rowOf(stuck);

    // A new instance starting up, as after the crash.
    const stop = new MailRelay(t.ctx.dataSource, t.ctx.mailer, logger, testClock).start({ everyMs: HOUR });
    try {
      await expect
        .poll(async () => (await outboxRows(t.ctx.dataSource, { to })).filter((r) => r.status === "sent").length)
        .toBe(2);
    } finally {
      await stop();
    }
    expect((await rowOf(pending)).status).toBe("sent");
    // The resend after the crash carries the same Message-ID, so a receiver that got the first copy can drop this one.
    expect(await rowOf(stuck)).toMatchObject({ status: "sent", attempts: 2, messageId: stuckRow.messageId });
    expect(copiesOf(t.mail, stuckRow.messageId)).toBe(1);
    expect((await rowOf(leased)).status).toBe("sending");
    await repo.update(leased, { status: "failed" });
  });

  it("two relays racing send each e-mail once", async () => {
    const to = `race.${Date.now()}@test.example`;
    const ids: number[] = [];
    for (let i = 0; i < 12; i++) ids.push(await queuedOnly(to, "fixConfirmed", String(i)));
    const mailers = [createMailer(t.ctx.config), createMailer(t.ctx.config)];
    try {
      await Promise.all(mailers.map((m) => new MailRelay(t.ctx.dataSource, m, logger, testClock).drain()));
    } finally {
      for (const m of mailers) m.close();
    }
    const rows = await outboxRows(t.ctx.dataSource, { to });
    expect(rows.map((r) => r.status)).toEqual(ids.map(() => "sent"));
    const caught = t.mail.mails.filter((m) => m.to.includes(to));
    expect(caught).toHaveLength(12);
    expect(new Set(caught.map((m) => m.messageId)).size).toBe(12);
    expect(new Set(caught.map((m) => m.messageId))).toEqual(new Set(rows.map((r) => r.messageId)));
    for (const r of rows) expect(r.messageId).toMatch(new RegExp(`^<outbox-${r.id}-[A-Za-z0-9_-]+@dewline>$`));
  });
});

describe("what is stored and sent", () => {
  it("keeps the text, an HTML version (tenant words escaped) and the attachments, and sends them all", async () => {
    const to = `whole.${Date.now()}@test.example`;
    const id = await queuedOnly(to, "appointmentCancelled", "& co");
    const row = await rowOf(id);
    expect(row.textBody).toContain("Operative ill <b>& co</b>");
    expect(row.htmlBody).toContain("Operative ill &lt;b&gt;&amp; co&lt;/b&gt;");
    expect(row.htmlBody).toContain('<a href="http://dewline.test/cases/2">');
    expect(row.attachments).toEqual([
      expect.objectContaining({ filename: "appointment.ics", contentType: expect.stringContaining("method=CANCEL") }),
    ]);
    t.ctx.services.mail.relay.wake();
    const mail = await t.mail.lastTo(to);
    expect(mail.raw).toContain("Content-Type: text/plain");
    expect(mail.raw).toContain("Content-Type: text/html");
    expect(mail.raw).toContain("Operative ill &lt;b&gt;&amp; co&lt;/b&gt;");
    expect(mail.raw).toMatch(/filename="?appointment\.ics/);
    expect(mail.raw).toContain("METHOD:CANCEL");
    expect(mail.messageId).toBe(row.messageId);
  });

  it("forgets a password-reset e-mail's link once it is sent, and will not resend it", async () => {
    const anon = await (await import("../support/test-app.js")).anonymousClient(t.app);
    await anon.post("/api/auth/password-reset", { email: landlord.officer.email }).expect(202);
    await mailSettled(t);
    const [row] = await outboxRows(t.ctx.dataSource, { to: landlord.officer.email, template: "passwordReset" });
    expect(row).toMatchObject({ status: "sent", textBody: null, htmlBody: null });
    const admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
    await admin.post(`/api/outbox/${row!.id}/resend`).expect(409);
  });
});

describe("staff see each e-mail's state and can resend it", () => {
  let admin: Client;
  let officer: Client;
  let caseId: number;
  let ackId: number;

  beforeAll(async () => {
    admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
    officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    caseId = (await tenant.post("/api/cases", report).expect(201)).body.id;
    await mailSettled(t);
    ackId = (await ackOf(caseId)).id;
  });

  it("lists the landlord's e-mails with their state, newest first, filtered by state", async () => {
    const list = await admin.get("/api/outbox?pageSize=50").expect(200);
    const item = list.body.items.find((i: { id: number }) => i.id === ackId);
    expect(item).toMatchObject({ to: landlord.tenant.email, template: "caseAcknowledgement", status: "sent", attempts: 1 });
    expect(item.case).toEqual({ id: caseId });
    expect(item).not.toHaveProperty("textBody");
    const sent = await admin.get("/api/outbox?status=sent").expect(200);
    expect(sent.body.items.every((i: { status: string }) => i.status === "sent")).toBe(true);
    const failed = await admin.get("/api/outbox?status=failed").expect(200);
    expect(failed.body.items.some((i: { id: number }) => i.id === ackId)).toBe(false);
    await admin.get("/api/outbox?status=lost").expect(400);
    // Another landlord's admin does not see it.
    const otherAdmin = await signedInClient(t.app, other.admin.email, PASSWORD);
    const theirs = await otherAdmin.get("/api/outbox?pageSize=200").expect(200);
    expect(theirs.body.items.some((i: { id: number }) => i.id === ackId)).toBe(false);
  });

  it("lets officers see the e-mails about cases, not other e-mails, and keeps tenants and maintenance out", async () => {
    const list = await officer.get("/api/outbox?pageSize=200").expect(200);
    expect(list.body.items.some((i: { id: number }) => i.id === ackId)).toBe(true);
    expect(list.body.items.every((i: { case: unknown }) => i.case !== null)).toBe(true);
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    await tenant.get("/api/outbox").expect(403);
    await tenant.post(`/api/outbox/${ackId}/resend`).expect(403);
    const maintenance = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
    await maintenance.get("/api/outbox").expect(403);
  });

  it("resends a sent e-mail as a new copy, for its own landlord only", async () => {
    const before = await rowOf(ackId);
    const otherAdmin = await signedInClient(t.app, other.admin.email, PASSWORD);
    await otherAdmin.post(`/api/outbox/${ackId}/resend`).expect(404);
    await admin.post(`/api/outbox/999999999/resend`).expect(404);
    expect(await rowOf(ackId)).toMatchObject({ status: "sent", messageId: before.messageId });

    const res = await officer.post(`/api/outbox/${ackId}/resend`).expect(202);
    expect(res.body).toMatchObject({ id: ackId, status: expect.stringMatching(/^(pending|sending|sent)$/) });
    await mailSettled(t);
    const after = await rowOf(ackId);
    expect(after).toMatchObject({ status: "sent", attempts: 1 });
    expect(after.messageId).not.toBe(before.messageId);
    expect(copiesOf(t.mail, after.messageId)).toBe(1);
    expect(copiesOf(t.mail, before.messageId)).toBe(1);
  });

  it("puts each e-mail sent again on its case's timeline, for the tenant only when it was their own e-mail", async () => {
    const tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const ownCase = (await tenant.post("/api/cases", report).expect(201)).body.id as number;
    // An e-mail about the case to the officer, which the tenant never sees on the timeline.
    const { outboxId: alertId } = await t.ctx.dataSource.transaction((m) =>
      t.ctx.services.mail.enqueueWithId(m, {
        to: landlord.officer.email,
        template: "caseAlert",
        data: { reference: "DW-2026-00003", address: "3 Test Street", reasons: ["A vulnerable household."], link: "x" },
        organisationId: landlord.org.id,
        related: { type: "case", id: ownCase },
      }),
    );
    t.ctx.services.mail.relay.wake();
    await mailSettled(t);
    const ack = await ackOf(ownCase);
    const resent = (events: { type: string }[]) => events.filter((e) => e.type === "email-resent");

    await officer.post(`/api/outbox/${ack.id}/resend`).expect(202);
    await admin.post(`/api/outbox/${alertId}/resend`).expect(202);
    await mailSettled(t);

    const staffView = resent((await officer.get(`/api/cases/${ownCase}/events`).expect(200)).body.events);
    expect(staffView).toEqual([
      expect.objectContaining({
        actor: { name: "Test officer", role: "officer" },
        after: { outboxId: ack.id, to: landlord.tenant.email, template: "caseAcknowledgement", subject: ack.subject },
        email: expect.objectContaining({ status: "sent", to: landlord.tenant.email }),
      }),
      expect.objectContaining({
        actor: { name: "Test admin", role: "admin" },
        after: expect.objectContaining({
          outboxId: alertId,
          to: landlord.officer.email,
          subject: expect.stringContaining("DW-2026-00003"),
        }),
      }),
    ]);
    const tenantView = resent((await tenant.get(`/api/cases/${ownCase}/events`).expect(200)).body.events);
    expect(tenantView).toEqual([
      expect.objectContaining({ after: expect.objectContaining({ outboxId: ack.id, to: landlord.tenant.email }), email: null }),
    ]);

    // A resend that is refused puts nothing on the timeline.
    const { outboxId: queued } = await t.ctx.dataSource.transaction((m) =>
      t.ctx.services.mail.enqueueWithId(m, {
        to: landlord.officer.email,
        template: "caseAlert",
        data: { reference: "DW-2026-00004", address: "4 Test Street", reasons: ["Mould risk."], link: "x" },
        organisationId: landlord.org.id,
        related: { type: "case", id: ownCase },
      }),
    );
    await officer.post(`/api/outbox/${queued}/resend`).expect(409);
    expect(resent((await officer.get(`/api/cases/${ownCase}/events`).expect(200)).body.events)).toHaveLength(2);
    t.ctx.services.mail.relay.wake();
    await mailSettled(t);
  });

  it("resends a failed e-mail; one still queued is refused", async () => {
    const to = `failed.${Date.now()}@test.example`;
    const id = await queuedOnly(to);
    await t.ctx.dataSource
      .getRepository(OutboxEmail)
      .update(id, { status: "failed", attempts: 20, error: "550 no such mailbox" });
    await admin.post(`/api/outbox/${id}/resend`).expect(202);
    await mailSettled(t);
    expect(await rowOf(id)).toMatchObject({ status: "sent", error: null });
    expect(t.mail.mails.filter((m) => m.to.includes(to))).toHaveLength(1);

    const queued = await queuedOnly(`queued.${Date.now()}@test.example`);
    await admin.post(`/api/outbox/${queued}/resend`).expect(409);
    await mailSettled(t);
  });
});
