// Admins' changes to the landlord's integrations — API keys created and revoked, webhook endpoints
// added, changed, removed and given a new secret — are recorded with who, what and when, in the same
// transaction as the change, and shown to the landlord's admins only. Against the real MariaDB.
import { pino } from "pino";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { adminActionListResponse, type AdminActionEntryDto } from "../../src/lib/contracts/integrations.js";
import type { Actor } from "../../server/lib/actor.js";
import type { AdminActionService } from "../../server/modules/integrations/admin-action.service.js";
import { ApiKey } from "../../server/modules/integrations/api-key.entity.js";
import { ApiKeyService } from "../../server/modules/integrations/api-key.service.js";
import { WebhookEndpoint } from "../../server/modules/webhooks/webhook-endpoint.entity.js";
import { WebhookService } from "../../server/modules/webhooks/webhook.service.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { testClock } from "../support/test-clock.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let admin: Client;
let officer: Client;
let otherAdmin: Client;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  const other = await makeLandlord(t.ctx.dataSource);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  otherAdmin = await signedInClient(t.app, other.admin.email, PASSWORD);
});
afterAll(() => t.close());

async function actions(client: Client, query = ""): Promise<AdminActionEntryDto[]> {
  const res = await client.get(`/api/integrations/admin-actions${query}`).expect(200);
  return adminActionListResponse.parse(res.body).entries;
}

describe("admins' changes to keys and webhooks", () => {
  it("are listed newest first with who made them, what and when, never with a secret", async () => {
    const from = testClock.now().getTime();
    const key = await admin.post("/api/integrations/api-keys", { name: "Housing system", scopes: ["homes:read"] }).expect(201);
    await admin.post(`/api/integrations/api-keys/${key.body.id}/revoke`).expect(200);
    await admin.post(`/api/integrations/api-keys/${key.body.id}/revoke`).expect(200); // again: nothing new to record
    const url = "http://127.0.0.1:9/hooks";
    const hook = await admin.post("/api/webhooks", { url, eventTypes: ["case.created"] }).expect(201);
    const endpointId: number = hook.body.endpoint.id;
    await admin
      .patch(`/api/webhooks/${endpointId}`, { active: false, eventTypes: ["case.created", "work-order.booked"] })
      .expect(200);
    await admin.patch(`/api/webhooks/${endpointId}`, { active: false }).expect(200); // no change: nothing recorded
    const rotated = await admin.post(`/api/webhooks/${endpointId}/secret`).expect(200);
    await admin.agent.delete(`/api/webhooks/${endpointId}`).set("X-CSRF-Token", admin.csrf).expect(204);

    const to = testClock.now().getTime();
    const all = await actions(admin);
    expect(all.map((a) => [a.action, a.subject])).toEqual([
      ["webhook-removed", { kind: "webhook", id: endpointId }],
      ["webhook-secret-replaced", { kind: "webhook", id: endpointId }],
      ["webhook-changed", { kind: "webhook", id: endpointId }],
      ["webhook-created", { kind: "webhook", id: endpointId }],
      ["api-key-revoked", { kind: "api-key", id: key.body.id }],
      ["api-key-created", { kind: "api-key", id: key.body.id }],
    ]);
    for (const a of all) {
      expect(a.by).toEqual({ id: landlord.admin.id, name: landlord.admin.name });
      expect(Date.parse(a.at)).toBeGreaterThanOrEqual(from);
      expect(Date.parse(a.at)).toBeLessThanOrEqual(to);
    }
    expect(all.find((a) => a.action === "api-key-created")!.detail).toContain("Housing system");
    expect(all.find((a) => a.action === "webhook-created")!.detail).toContain(url);
    const changed = all.find((a) => a.action === "webhook-changed")!.detail;
    expect(changed).toContain("switched off");
    expect(changed).toContain("work-order.booked");
    const text = JSON.stringify(all);
    expect(text).not.toContain(key.body.secret);
    expect(text).not.toContain(hook.body.secret);
    expect(text).not.toContain(rotated.body.secret);

    // Each page shows its own: keys on Integrations, endpoints on Webhooks.
    expect((await actions(admin, "?subject=api-key")).map((a) => a.action)).toEqual(["api-key-revoked", "api-key-created"]);
    expect((await actions(admin, "?subject=webhook")).map((a) => a.subject.kind)).toEqual(Array(4).fill("webhook"));
    await admin.get("/api/integrations/admin-actions?subject=everything").expect(400);
  });

  it("record nothing for a change refused, and are shown to no one but the landlord's admins", async () => {
    const before = (await actions(admin)).length;
    await admin.post("/api/webhooks", { url: "ftp://example.org/x", eventTypes: ["case.created"] }).expect(400);
    await admin.post("/api/integrations/api-keys", { name: "", scopes: ["homes:read"] }).expect(400);
    const hook = await admin.post("/api/webhooks", { url: "http://127.0.0.1:9/x", eventTypes: ["case.created"] }).expect(201);
    await otherAdmin.patch(`/api/webhooks/${hook.body.endpoint.id}`, { active: false }).expect(404);
    await otherAdmin.post(`/api/webhooks/${hook.body.endpoint.id}/secret`).expect(404);
    await admin.patch(`/api/webhooks/${hook.body.endpoint.id}`, { url: "http://example.org/plain" }).expect(400);
    expect((await actions(admin)).length).toBe(before + 1);
    expect(await actions(otherAdmin)).toEqual([]);
    await officer.get("/api/integrations/admin-actions").expect(403);
  });

  it("leave no change without its record: when the record cannot be written, the change is undone", async () => {
    // The record is written in the change's transaction; a recorder that fails takes the change down with it.
    const refusing = {
      record: () => Promise.reject(new Error("the record could not be written")),
    } as unknown as AdminActionService;
    const actor: Actor = {
      id: landlord.admin.id,
      email: landlord.admin.email,
      name: landlord.admin.name,
      role: "admin",
      organisationId: landlord.org.id,
    };
    const webhooks = new WebhookService(t.ctx.dataSource, t.ctx.config, pino({ level: "silent" }), testClock, refusing);
    const url = "http://127.0.0.1:9/never-recorded";
    await expect(webhooks.create(actor, { url, description: "", eventTypes: ["case.created"] })).rejects.toThrow(/record/);
    expect(await t.ctx.dataSource.getRepository(WebhookEndpoint).countBy({ url })).toBe(0);

    const keys = new ApiKeyService(t.ctx.dataSource, t.ctx.services.users, testClock, refusing);
    await expect(keys.create(actor, { name: "Never recorded", scopes: ["homes:read"] })).rejects.toThrow(/record/);
    expect(await t.ctx.dataSource.getRepository(ApiKey).countBy({ name: "Never recorded" })).toBe(0);
    const kept = await admin.post("/api/integrations/api-keys", { name: "Kept", scopes: ["homes:read"] }).expect(201);
    await expect(keys.revoke(actor, kept.body.id)).rejects.toThrow(/record/);
    expect(await t.ctx.dataSource.getRepository(ApiKey).findOneByOrFail({ id: kept.body.id })).toMatchObject({ revokedAt: null });
  });
});
