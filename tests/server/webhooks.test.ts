// Signed webhooks: an admin registers an endpoint of the landlord's own system; case events become
// deliveries in the same transaction as the change, and a relay sends them, signed, retrying with
// backoff. A real HTTP receiver here checks each signature with its own verifier below, written from
// the documented format (DEVELOPERS.md "Verifying Dewline webhooks"), not with the server's code.
// The relay is driven by hand (drain) and by clocks the test sets, never by waiting for time.
import { createHmac, timingSafeEqual } from "node:crypto";
import { pino } from "pino";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import {
  webhookDeliveryPageResponse,
  webhookDeliveryResponse,
  webhookEndpointListResponse,
  webhookSecretResponse,
} from "../../src/lib/contracts/webhooks.js";
import { WebhookDelivery } from "../../server/modules/webhooks/webhook-delivery.entity.js";
import { WebhookEndpoint } from "../../server/modules/webhooks/webhook-endpoint.entity.js";
import { WebhookEvent } from "../../server/modules/webhooks/webhook-event.entity.js";
import { endpointUrlProblem } from "../../server/modules/webhooks/webhook-url.js";
import { WebhookRelay } from "../../server/modules/webhooks/webhook.relay.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { daysAgo, testClock, workingDayAhead } from "../support/test-clock.js";
import { startWebhookReceiver, type ReceivedHook, type WebhookReceiver } from "../support/webhook-receiver.js";

const logger = pino({ level: "silent" });
/** A clock `ms` ahead of the tests' clock: a retry's backoff has passed by then. */
const later = (ms: number) => ({ now: () => new Date(testClock.now().getTime() + ms) });

// ---- the receiver's side: an independent verifier -------------------------------------------------

type Verdict = "valid" | "stale" | "bad-signature" | "malformed";

/** What an integrator writes: parse t= and every v1=, reject a timestamp over 5 minutes off, compare in constant time. */
function verify(header: string | undefined, rawBody: string, secret: string, nowSeconds: number): Verdict {
  if (!header) return "malformed";
  let t: number | null = null;
  const candidates: string[] = [];
  for (const part of header.split(",")) {
    const [k, v] = part.split("=", 2) as [string, string | undefined];
    if (k === "t" && v && /^\d+$/.test(v)) t = Number(v);
    if (k === "v1" && v && /^[0-9a-f]{64}$/.test(v)) candidates.push(v);
  }
  if (t === null || !candidates.length) return "malformed";
  if (Math.abs(nowSeconds - t) > 300) return "stale";
  const expected = createHmac("sha256", secret).update(`${t}.${rawBody}`).digest();
  return candidates.some((c) => timingSafeEqual(Buffer.from(c, "hex"), expected)) ? "valid" : "bad-signature";
}

const nowSeconds = () => Math.floor(testClock.now().getTime() / 1000);
const header = (h: ReceivedHook, name: string) => h.headers[name.toLowerCase()] as string | undefined;
const bodyOf = (h: ReceivedHook) =>
  JSON.parse(h.body) as {
    id: string;
    type: string;
    case: { id: number } | null;
    landlord: { id: number };
    data: Record<string, unknown>;
  };

// ---- set-up ------------------------------------------------------------------------------------------

let t: TestApp;
let receiver: WebhookReceiver;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let other: Awaited<ReturnType<typeof makeLandlord>>;
let admin: Client;
let officer: Client;
let tenant: Client;
let otherTenant: Client;
let otherAdmin: Client;

const report = {
  description: "Black mould behind the wardrobe in the back bedroom.",
  locations: ["behind-furniture"],
  observations: ["mould-spots"],
};

beforeAll(async () => {
  t = await createTestApp();
  receiver = await startWebhookReceiver();
  landlord = await makeLandlord(t.ctx.dataSource);
  other = await makeLandlord(t.ctx.dataSource);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  otherTenant = await signedInClient(t.app, other.tenant.email, PASSWORD);
  otherAdmin = await signedInClient(t.app, other.admin.email, PASSWORD);
});
afterAll(async () => {
  // Nothing of ours is left for another file's relay to find.
  await t.ctx.dataSource.getRepository(WebhookDelivery).update({ status: "pending" }, { status: "failed" });
  await t.close();
  await receiver.close();
});

// Each test's endpoints go with it, so a failed test leaves no listener behind for the next one.
afterEach(async () => {
  await t.ctx.dataSource.getRepository(WebhookEndpoint).delete({ organisationId: landlord.org.id });
});

let registered = 0;
/** Registers an endpoint at a path of its own on the receiver; `received()` is what reached that path. */
async function register(client: Client, eventTypes: string[]) {
  const url = `${receiver.url}/${++registered}`;
  const res = await client.post("/api/webhooks", { url, description: "Housing system", eventTypes }).expect(201);
  webhookSecretResponse.parse(res.body);
  const path = new URL(url).pathname;
  return {
    id: res.body.endpoint.id as number,
    secret: res.body.secret as string,
    url,
    received: () => receiver.received.filter((h) => h.path === path),
  };
}

const deliveriesOf = (endpointId: number) =>
  t.ctx.dataSource.getRepository(WebhookDelivery).find({ where: { endpointId }, order: { id: "ASC" } });

/** Sends what is due now, and answers what arrived meanwhile. */
async function drainAndCollect(relay = t.ctx.services.webhooks.relay, url?: string): Promise<ReceivedHook[]> {
  const before = receiver.received.length;
  await relay.drain();
  const path = url === undefined ? null : new URL(url).pathname;
  return receiver.received.slice(before).filter((h) => path === null || h.path === path);
}

// ---- the tests ---------------------------------------------------------------------------------------

describe("registering an endpoint", () => {
  it("answers the signing secret once, never lists it, and refuses an address that is not https", async () => {
    const { id, secret } = await register(admin, ["case.created"]);
    expect(secret).toMatch(/^whsec_[A-Za-z0-9_-]{43}$/);
    const list = await admin.get("/api/webhooks").expect(200);
    webhookEndpointListResponse.parse(list.body);
    expect(list.body.items.find((e: { id: number }) => e.id === id)).toMatchObject({ eventTypes: ["case.created"] });
    expect(JSON.stringify(list.body)).not.toContain(secret);

    const bad = await admin.post("/api/webhooks", { url: "http://example.org/hook", eventTypes: ["case.created"] }).expect(400);
    expect(bad.body.error.details[0]).toMatchObject({ field: "url" });
    await admin.post("/api/webhooks", { url: "ftp://example.org/hook", eventTypes: ["case.created"] }).expect(400);
    await admin.post("/api/webhooks", { url: receiver.url, eventTypes: [] }).expect(400);
    await admin.post("/api/webhooks", { url: receiver.url, eventTypes: ["case.deleted"] }).expect(400);
    // Another landlord's admin cannot see or touch it.
    expect((await otherAdmin.get("/api/webhooks").expect(200)).body.items).toEqual([]);
    await otherAdmin.patch(`/api/webhooks/${id}`, { active: false }).expect(404);
    await admin.agent.delete(`/api/webhooks/${id}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });

  it("in production, refuses plain http and addresses of this machine or a private network", () => {
    expect(endpointUrlProblem("http://127.0.0.1:4000/x", false)).toBeNull();
    expect(endpointUrlProblem("http://127.0.0.1:4000/x", true)).not.toBeNull();
    expect(endpointUrlProblem("https://localhost/x", true)).not.toBeNull();
    expect(endpointUrlProblem("https://10.1.2.3/x", true)).not.toBeNull();
    expect(endpointUrlProblem("https://192.168.0.10/x", true)).not.toBeNull();
    expect(endpointUrlProblem("https://[::1]/x", true)).not.toBeNull();
    expect(endpointUrlProblem("https://user:pw@example.org/x", true)).not.toBeNull();
    expect(endpointUrlProblem("https://hooks.example.org/dewline", true)).toBeNull();
  });
});

describe("a case event", () => {
  it("is queued with the case, delivered signed, and a tampered body or an old timestamp is detected", async () => {
    const { id: endpointId, secret, url } = await register(admin, ["case.created", "case.status-changed"]);
    const created = await tenant.post("/api/cases", report).expect(201);
    // Committed with the case, before anything was sent.
    const queued = await deliveriesOf(endpointId);
    expect(queued).toHaveLength(1);
    expect(queued[0]).toMatchObject({ status: "pending", attempts: 0 });

    const [hook, ...more] = await drainAndCollect(undefined, url);
    expect(more).toEqual([]);
    expect(hook).toBeDefined();
    const body = bodyOf(hook!);
    expect(body).toMatchObject({ type: "case.created", case: { id: created.body.id }, landlord: { id: landlord.org.id } });
    expect(header(hook!, "Dewline-Event-Id")).toBe(body.id);
    expect(header(hook!, "Content-Type")).toBe("application/json");
    // The tenant's own words are not sent to other systems.
    expect(hook!.body).not.toContain("wardrobe");

    const signature = header(hook!, "Dewline-Signature");
    expect(verify(signature, hook!.body, secret, nowSeconds())).toBe("valid");
    expect(verify(signature, hook!.body.replace(`"case.created"`, `"case.deleted"`), secret, nowSeconds())).toBe("bad-signature");
    expect(verify(signature, hook!.body, "whsec_not-the-secret", nowSeconds())).toBe("bad-signature");
    // Replayed later than 5 minutes: refused by its timestamp, even with a good signature.
    expect(verify(signature, hook!.body, secret, nowSeconds() + 301)).toBe("stale");
    expect((await deliveriesOf(endpointId))[0]).toMatchObject({ status: "delivered", attempts: 1 });

    // A status change is an event of its own; a type the endpoint did not choose is not sent.
    await officer.patch(`/api/cases/${created.body.id}`, { status: "triaged", reason: "Seen the photos." }).expect(200);
    const [changed] = await drainAndCollect(undefined, url);
    expect(bodyOf(changed!)).toMatchObject({ type: "case.status-changed", data: { from: "new", to: "triaged" } });
    expect(changed!.body).not.toContain("Seen the photos");
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });

  it("is retried after a 500 and then delivered once, every attempt visible to the admin with its response code", async () => {
    const { id: endpointId, secret, url, received } = await register(admin, ["case.created"]);
    receiver.answers.push(500);
    await tenant.post("/api/cases", report).expect(201);

    const first = await drainAndCollect(undefined, url);
    expect(first).toHaveLength(1);
    const [row] = await deliveriesOf(endpointId);
    expect(row).toMatchObject({ status: "pending", attempts: 1 });
    // Backoff: not due again yet, so a drain now sends nothing.
    expect(await drainAndCollect(undefined, url)).toEqual([]);

    const second = await drainAndCollect(new WebhookRelay(t.ctx.dataSource, logger, later(31_000)), url);
    expect(second).toHaveLength(1);
    expect(header(second[0]!, "Dewline-Event-Id")).toBe(header(first[0]!, "Dewline-Event-Id"));
    expect(header(second[0]!, "Dewline-Delivery-Attempt")).toBe("2");
    // Signed afresh at the attempt's own time (the later clock's).
    expect(verify(header(second[0]!, "Dewline-Signature"), second[0]!.body, secret, nowSeconds() + 31)).toBe("valid");
    expect(await drainAndCollect(new WebhookRelay(t.ctx.dataSource, logger, later(3_600_000)), url)).toEqual([]);

    const page = await admin.get(`/api/webhooks/${endpointId}/deliveries`).expect(200);
    webhookDeliveryPageResponse.parse(page.body);
    expect(page.body.items).toHaveLength(1);
    expect(page.body.items[0]).toMatchObject({ status: "delivered", attempts: 2, eventType: "case.created" });
    expect(page.body.items[0].history.map((a: { statusCode: number }) => a.statusCode)).toEqual([200, 500]);

    // "Send again": the same event, the same id, once more.
    const resent = await admin.post(`/api/webhooks/${endpointId}/deliveries/${row!.id}/resend`).expect(202);
    expect(webhookDeliveryResponse.parse(resent.body)).toMatchObject({ status: "pending", attempts: 0 });
    await t.ctx.services.webhooks.relay.idle();
    expect(received()).toHaveLength(3);
    const again = received().at(-1)!;
    expect(header(again, "Dewline-Event-Id")).toBe(header(first[0]!, "Dewline-Event-Id"));
    expect((await deliveriesOf(endpointId))[0]).toMatchObject({ status: "delivered", attempts: 1 });
    await otherAdmin.post(`/api/webhooks/${endpointId}/deliveries/${row!.id}/resend`).expect(404);
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });

  it("of another landlord never goes to this landlord's endpoint", async () => {
    const { id: endpointId } = await register(admin, ["case.created"]);
    await otherTenant.post("/api/cases", report).expect(201);
    expect(await deliveriesOf(endpointId)).toEqual([]);
    const sent = await drainAndCollect();
    expect(sent.filter((h) => bodyOf(h).landlord.id === other.org.id)).toEqual([]);
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });

  it("is not lost across a restart: queued by one app, delivered by the next on the same database", async () => {
    const first = await createTestApp();
    const firstAdmin = await signedInClient(first.app, landlord.admin.email, PASSWORD);
    const firstTenant = await signedInClient(first.app, landlord.tenant.email, PASSWORD);
    const url = `${receiver.url}/after-restart`;
    const res = await firstAdmin.post("/api/webhooks", { url, eventTypes: ["case.created"] }).expect(201);
    const endpointId: number = res.body.endpoint.id;
    const created = await firstTenant.post("/api/cases", report).expect(201);
    await first.close();
    expect(await deliveriesOf(endpointId)).toMatchObject([{ status: "pending" }]);

    const second = await createTestApp();
    const before = receiver.received.length;
    try {
      const stop = second.ctx.services.webhooks.relay.start({ everyMs: 60_000 });
      await second.ctx.services.webhooks.relay.idle();
      await stop();
    } finally {
      await second.close();
    }
    const arrived = receiver.received.slice(before).filter((h) => h.path === new URL(url).pathname);
    expect(bodyOf(arrived[0]!).case?.id).toBe(created.body.id);
    expect(arrived).toHaveLength(1);
    expect(verify(header(arrived[0]!, "Dewline-Signature"), arrived[0]!.body, res.body.secret, nowSeconds())).toBe("valid");
    expect(await deliveriesOf(endpointId)).toMatchObject([{ status: "delivered" }]);
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });

  it("is not queued when the change rolls back", async () => {
    const { id: endpointId } = await register(admin, ["case.status-changed"]);
    const created = await tenant.post("/api/cases", report).expect(201);
    // A move the workflow refuses: 409, nothing changes, nothing is queued.
    await officer.patch(`/api/cases/${created.body.id}`, { status: "closed", reason: "No." }).expect(409);
    expect(await deliveriesOf(endpointId)).toEqual([]);
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });
});

describe("a missed deadline", () => {
  it("is sent once per case and stage, however often the figures are worked out", async () => {
    const { id: endpointId, url } = await register(admin, ["case.deadline-missed"]);
    const created = await officer
      .post("/api/cases", {
        ...report,
        propertyId: landlord.home.id,
        channel: "phone",
        awareAt: daysAgo(60).toISOString(),
      })
      .expect(201);
    await t.ctx.services.triage.refresh(created.body.id);
    await officer.patch(`/api/cases/${created.body.id}`, { assigneeId: landlord.officer.id }).expect(200);
    await t.ctx.services.triage.refresh(created.body.id);

    const events = await t.ctx.dataSource
      .getRepository(WebhookEvent)
      .find({ where: { caseId: created.body.id, type: "case.deadline-missed" } });
    expect(events).toHaveLength(1);
    const sent = await drainAndCollect(undefined, url);
    expect(sent).toHaveLength(1);
    expect(bodyOf(sent[0]!)).toMatchObject({ type: "case.deadline-missed", data: { stage: "investigate" } });
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });
});

describe("work orders", () => {
  it("are sent when booked and when completed, without the operative's notes", async () => {
    const { url } = await register(admin, ["work-order.booked", "work-order.completed"]);
    const lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    await officer
      .patch(`/api/cases/${c.id}`, { status: "triaged", hazardClass: "significant", reason: "Mould over a bed." })
      .expect(200);
    await officer
      .post(`/api/cases/${c.id}/inspections`, {
        inspectedAt: daysAgo(0).toISOString(),
        cause: "condensation",
        mouldExtent: "under-1-m2",
        findings: "Condensation mould behind the wardrobe.",
        roomReadings: [],
      })
      .expect(201);
    const wo = (
      await officer.post(`/api/cases/${c.id}/work-orders`, { type: "mould-wash", description: "Wash the wall." }).expect(201)
    ).body;
    const date = workingDayAhead(10);
    await lead
      .patch(`/api/work-orders/${wo.id}`, { assigneeId: landlord.maintenance.id, slot: { date, window: "am" } })
      .expect(200);
    await lead
      .patch(`/api/work-orders/${wo.id}`, {
        complete: {
          note: "Washed the wall behind the wardrobe with fungicide.",
          doneOn: localDate(testClock.now()),
          earlyReason: "The tenant asked for an earlier visit.",
        },
      })
      .expect(200);
    const sent = await drainAndCollect(undefined, url);
    expect(sent.map((h) => bodyOf(h).type)).toEqual(["work-order.booked", "work-order.completed"]);
    expect(bodyOf(sent[0]!)).toMatchObject({ case: { id: c.id }, data: { workOrderId: wo.id, date, window: "am" } });
    expect(bodyOf(sent[1]!)).toMatchObject({ data: { workOrderId: wo.id, doneOn: localDate(testClock.now()) } });
    expect(sent[1]!.body).not.toContain("fungicide");
  });
});

describe("rotating the secret", () => {
  it("signs with the new secret and, for a while, the old one too", async () => {
    const { id: endpointId, secret: old, url } = await register(admin, ["case.created"]);
    const rotated = await admin.post(`/api/webhooks/${endpointId}/secret`).expect(200);
    const fresh: string = rotated.body.secret;
    expect(fresh).not.toBe(old);
    await tenant.post("/api/cases", report).expect(201);
    const [hook] = await drainAndCollect(undefined, url);
    const signature = header(hook!, "Dewline-Signature");
    expect(verify(signature, hook!.body, fresh, nowSeconds())).toBe("valid");
    expect(verify(signature, hook!.body, old, nowSeconds())).toBe("valid");
    // After the grace period only the new secret signs. The app's own relay (on today's clock) is
    // stopped first: "send test" wakes it, and it could otherwise send the delivery before the later one.
    await t.ctx.services.webhooks.relay.stop();
    await admin.post(`/api/webhooks/${endpointId}/test`).expect(202);
    const [late] = await drainAndCollect(new WebhookRelay(t.ctx.dataSource, logger, later(25 * 3_600_000)), url);
    const lateSignature = header(late!, "Dewline-Signature");
    expect(verify(lateSignature, late!.body, fresh, nowSeconds() + 25 * 3600)).toBe("valid");
    expect(verify(lateSignature, late!.body, old, nowSeconds() + 25 * 3600)).toBe("bad-signature");
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });
});

describe("relays on several instances", () => {
  it("never deliver one event twice when they race for the same deliveries", async () => {
    const { id: endpointId, url, received } = await register(admin, ["case.created"]);
    for (let i = 0; i < 6; i++) await tenant.post("/api/cases", report).expect(201);
    // Two more relays (as on two more instances) and the app's own, all after the same rows.
    await Promise.all([
      new WebhookRelay(t.ctx.dataSource, logger, testClock).drain(),
      new WebhookRelay(t.ctx.dataSource, logger, testClock).drain(),
      drainAndCollect(undefined, url),
    ]);
    await t.ctx.services.webhooks.relay.idle();
    const ids = received().map((h) => header(h, "Dewline-Event-Id"));
    expect(ids).toHaveLength(6);
    expect(new Set(ids).size).toBe(6);
    expect((await deliveriesOf(endpointId)).map((d) => [d.status, d.attempts])).toEqual(ids.map(() => ["delivered", 1]));
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);
  });
});
