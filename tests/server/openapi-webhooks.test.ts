// The webhooks in the OpenAPI document (its 3.1 `webhooks` section): every event type the code can
// send is there, with its body's schema and the signature headers, and what the server really sends
// for an event has the documented shape. Against the real MariaDB.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  WEBHOOK_EVENT_TYPES,
  WEBHOOK_PAYLOADS,
  WEBHOOK_TEST_EVENT,
  webhookPayload,
  type WebhookEventType,
} from "../../src/lib/contracts/webhooks.js";
import { WebhookEndpoint } from "../../server/modules/webhooks/webhook-endpoint.entity.js";
import { WebhookEvent } from "../../server/modules/webhooks/webhook-event.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let admin: Client;
let officer: Client;
let tenant: Client;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(async () => {
  await t.ctx.dataSource.getRepository(WebhookEndpoint).delete({ organisationId: landlord.org.id });
  await t.close();
});

interface Operation {
  summary: string;
  description: string;
  parameters: { name: string; in: string; required?: boolean; description: string }[];
  requestBody: { content: Record<string, { schema: { properties: Record<string, { const?: string }>; required: string[] } }> };
  responses: Record<string, unknown>;
}

describe("the OpenAPI document's webhooks", () => {
  it("lists every event type the code can send, each with its body's schema and the signature headers", async () => {
    const doc = (await officer.get("/api/openapi.json").expect(200)).body;
    const everyType = [...WEBHOOK_EVENT_TYPES, WEBHOOK_TEST_EVENT];
    expect(Object.keys(doc.webhooks ?? {}).sort()).toEqual([...everyType].sort());
    for (const type of everyType) {
      const op = doc.webhooks[type].post as Operation;
      const schema = op.requestBody.content["application/json"]!.schema;
      expect(schema.properties.type!.const, type).toBe(type);
      expect(schema.required).toEqual(expect.arrayContaining(["id", "type", "occurredAt", "landlord", "case", "data"]));
      const headers = Object.fromEntries(op.parameters.filter((p) => p.in === "header").map((p) => [p.name, p]));
      expect(Object.keys(headers).sort()).toEqual(
        ["Dewline-Delivery-Attempt", "Dewline-Event-Id", "Dewline-Event-Type", "Dewline-Signature"].sort(),
      );
      expect(headers["Dewline-Signature"]).toMatchObject({ required: true });
      expect(headers["Dewline-Signature"]!.description).toMatch(/HMAC-SHA256/);
      expect(headers["Dewline-Signature"]!.description).toMatch(/t=.*v1=/);
      expect(Object.keys(op.responses)).toContain("2XX");
    }
    // The document says how a receiver checks a delivery.
    expect(doc.info.description).toMatch(/webhooks/i);
    // Free text stays out: the case's data in a status change has no reason.
    const statusData = doc.webhooks["case.status-changed"].post.requestBody.content["application/json"].schema.properties.data;
    expect(Object.keys(statusData.properties).sort()).toEqual(["from", "to"]);
  });

  it("documents the bodies the server really sends", async () => {
    await admin
      .post("/api/webhooks", { url: "http://127.0.0.1:9/never-called", eventTypes: [...WEBHOOK_EVENT_TYPES] })
      .expect(201);
    const created = await tenant
      .post("/api/cases", {
        description: "Mould on the bathroom ceiling.",
        locations: ["ceiling"],
        observations: ["mould-spots"],
      })
      .expect(201);
    await officer.patch(`/api/cases/${created.body.id}`, { status: "triaged", reason: "Photos seen." }).expect(200);
    const events = await t.ctx.dataSource.getRepository(WebhookEvent).find({ where: { caseId: created.body.id } });
    expect(events.map((e) => e.type).sort()).toEqual(["case.created", "case.status-changed"]);
    for (const e of events) {
      const body: unknown = JSON.parse(e.body);
      expect(() => WEBHOOK_PAYLOADS[e.type as WebhookEventType].parse(body), e.type).not.toThrow();
      expect(webhookPayload.parse(body)).toMatchObject({ type: e.type, case: { id: created.body.id } });
    }
  });
});
