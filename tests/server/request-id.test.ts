// Every response carries X-Request-Id; the same id is in the request's log line and in a 500's body,
// so a person can quote it and we can find the request.
import { Writable } from "node:stream";
import request from "supertest";
import { afterAll, beforeAll, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { createLogger } from "../../server/lib/logger.js";
import { anonymousClient, createTestApp, type TestApp } from "../support/test-app.js";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
let t: TestApp;
let app: TestApp["app"];
const lines: Record<string, unknown>[] = [];

beforeAll(async () => {
  t = await createTestApp();
  // The same app, logging into memory through the app's own logger settings.
  const sink = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const line of chunk.toString().split("\n")) if (line.trim()) lines.push(JSON.parse(line));
      done();
    },
  });
  app = createApp({ ...t.ctx, logger: createLogger("info", sink) });
});
afterAll(() => t?.close());

const loggedFor = (id: string) => lines.filter((l) => (l.req as { id?: unknown } | undefined)?.id === id);

it("gives each response a new id when the request brings none, and logs the request under it", async () => {
  const a = await request(app).get("/api/auth/csrf").expect(200);
  const b = await request(app).get("/api/auth/csrf").expect(200);
  const id = a.headers["x-request-id"];
  expect(id).toMatch(UUID);
  expect(b.headers["x-request-id"]).toMatch(UUID);
  expect(b.headers["x-request-id"]).not.toBe(id);
  expect(loggedFor(id)).toEqual([
    expect.objectContaining({ msg: "request completed", res: expect.objectContaining({ statusCode: 200 }) }),
  ]);
  // Not found and client errors carry it too.
  expect((await request(app).get("/api/nowhere").expect(404)).headers["x-request-id"]).toMatch(UUID);
});

it("keeps a proxy's id that looks like one and replaces anything else", async () => {
  const kept = await request(app).get("/api/health/live").set("X-Request-Id", "lb-7f3a.42:9").expect(200);
  expect(kept.headers["x-request-id"]).toBe("lb-7f3a.42:9");
  for (const bad of ["x".repeat(200), "<script>", "two words", "-starts-with-dash"]) {
    const res = await request(app).get("/api/health/live").set("X-Request-Id", bad).expect(200);
    expect(res.headers["x-request-id"]).toMatch(UUID);
  }
});

it("never writes a credential from the request's headers into the log", async () => {
  const secret = "dws_never-in-the-log-0123456789abcdefghijklmnop";
  const res = await request(app)
    .post("/api/sensor-ingest/readings")
    .set("Authorization", `Bearer ${secret}`)
    .set("Cookie", "dewline.sid=s%3Asession-cookie-value")
    .send({ readings: [{ takenAt: "2026-01-01T00:00:00Z", airTemperatureC: 20, relativeHumidityPct: 50 }] })
    .expect(401);
  const logged = JSON.stringify(loggedFor(res.headers["x-request-id"]));
  expect(logged).toContain("request completed");
  expect(logged).not.toContain(secret);
  expect(logged).not.toContain("session-cookie-value");
  expect(logged).toContain("[Redacted]");
});

it("puts the id of a failed request in the 500 body, the header and the error's log line", async () => {
  const client = await anonymousClient(app);
  // The database goes away under the app: signing in can only fail on our side.
  await t.ctx.dataSource.destroy();
  const res = await client.post("/api/auth/login", { email: "someone@example.org", password: "whatever-it-is" }).expect(500);
  const id = res.headers["x-request-id"];
  expect(id).toMatch(UUID);
  expect(res.body).toEqual({ error: { code: "internal", message: expect.any(String), requestId: id } });
  expect(loggedFor(id).map((l) => l.msg)).toContain("unhandled error");
});
