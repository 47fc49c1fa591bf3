// The public series calculator under load: it runs on the worker pool, each address has a budget of
// readings a minute (not of requests), and anonymous callers get a smaller size limit than signed-in ones.
import type { AddressInfo } from "node:net";
import { connect } from "node:net";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { evaluateSeries } from "../../src/lib/domain/index.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type TestApp } from "../support/test-app.js";

let t: TestApp;
let tenantEmail: string;
beforeAll(async () => {
  // A budget of 30 000 readings a minute per address; anonymous requests carry at most 10 000.
  t = await createTestApp({ CALCULATOR_READINGS_PER_MINUTE: "30000", CALCULATOR_MAX_ANONYMOUS_READINGS: "10000" });
  tenantEmail = (await makeLandlord(t.ctx.dataSource)).tenant.email;
});
afterAll(() => t.close());

const at0 = Date.UTC(2026, 0, 1);
const hourly = (n: number) =>
  Array.from({ length: n }, (_, i) => ({
    at: new Date(at0 + i * 3_600_000).toISOString(),
    airTemperatureC: 18 + (i % 5),
    relativeHumidityPct: 60 + (i % 30),
    surfaceTemperatureC: 11 + (i % 4),
  }));

describe("the series calculator's budget", () => {
  it("lets many small requests through, but refuses once an address has used its readings for the minute", async () => {
    // Each app has its own budget (like each limiter), all sharing the test context.
    const app = createApp(t.ctx);
    // 150 requests of 100 readings: more requests than the old 120 a minute, but only 15 000 readings.
    for (let i = 0; i < 150; i++) {
      await request(app)
        .post("/api/psychrometrics/series")
        .send({ readings: hourly(100) })
        .expect(200);
    }
    // A request of 10 000 still fits (25 000 used); the next big one does not.
    await request(app)
      .post("/api/psychrometrics/series")
      .send({ readings: hourly(10_000) })
      .expect(200);
    const refused = await request(app)
      .post("/api/psychrometrics/series")
      .send({ readings: hourly(10_000) })
      .expect(429);
    expect(Number(refused.headers["retry-after"])).toBeGreaterThan(0);
    expect(refused.body.error.message).toMatch(/readings/);
    expect(refused.body.error.message).toMatch(/Try again in/);
    // A small one still fits in what is left.
    await request(app)
      .post("/api/psychrometrics/series")
      .send({ readings: hourly(100) })
      .expect(200);
  }, 60_000);

  it("gives anonymous callers a lower size limit than signed-in ones", async () => {
    const app = createApp(t.ctx);
    const anonymous = await request(app)
      .post("/api/psychrometrics/series")
      .send({ readings: hourly(10_001) })
      .expect(413);
    expect(anonymous.body.error.message).toMatch(/at most 10,000/);
    expect(anonymous.body.error.message).toMatch(/sign in/i);

    const tenant = await signedInClient(app, tenantEmail, PASSWORD);
    const signedIn = await tenant.agent
      .post("/api/psychrometrics/series")
      .send({ readings: hourly(10_001) })
      .expect(200);
    expect(signedIn.body.count).toBe(10_001);
    const tooMany = await tenant.agent
      .post("/api/psychrometrics/series")
      .send({ readings: hourly(100_001) })
      .expect(413);
    expect(tooMany.body.error.message).toMatch(/at most 100,000/);
  }, 60_000);

  it("refuses an oversized or over-budget series from its length alone, without waiting for the body", async () => {
    const server = createApp(t.ctx).listen(0, "127.0.0.1");
    await new Promise((resolve) => server.once("listening", resolve));
    const { port } = server.address() as AddressInfo;
    // Announces a body of `length` bytes, sends only its first bytes, and reads whatever comes back.
    const announce = (length: number) =>
      new Promise<string>((resolve, reject) => {
        const socket = connect(port, "127.0.0.1");
        let reply = "";
        socket.on("data", (chunk: Buffer) => (reply += chunk.toString("latin1")));
        socket.on("close", () => resolve(reply));
        socket.on("error", reject);
        socket.write(
          `POST /api/psychrometrics/series HTTP/1.1\r\nHost: x\r\nContent-Type: application/json\r\nContent-Length: ${length}\r\n\r\n{"readings":[`,
        );
      });
    try {
      // 11 MB announced by an anonymous caller: refused at once, the connection closed (the body never read).
      const tooLarge = await announce(11_000_000);
      expect(tooLarge).toMatch(/^HTTP\/1\.1 413/);
      expect(tooLarge).toMatch(/connection: close/i);
      expect(tooLarge).toMatch(/sign in/i);

      // Spend this app's budget (30 000 a minute) with three full anonymous requests…
      for (let i = 0; i < 3; i++)
        await request(server)
          .post("/api/psychrometrics/series")
          .send({ readings: hourly(10_000) })
          .expect(200);
      // …then a body that must hold at least 4 000 readings is refused before it is read.
      const overBudget = await announce(1_000_000);
      expect(overBudget).toMatch(/^HTTP\/1\.1 429/);
      expect(overBudget).toMatch(/retry-after: \d+/i);
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  }, 60_000);

  it("evaluates on the worker pool with the same numbers as the engine", async () => {
    const app = createApp(t.ctx);
    const readings = [
      ...hourly(400),
      // after a gap, with outdoor temperatures (moisture excess) and an estimated surface
      ...hourly(200).map((r, i) => ({
        at: new Date(at0 + (500 + i) * 3_600_000).toISOString(),
        airTemperatureC: r.airTemperatureC,
        relativeHumidityPct: r.relativeHumidityPct,
        outdoorTemperatureC: 2 + (i % 7),
      })),
    ];
    const body = { readings, element: "single-glazing" as const, material: "sensitive" as const };
    const before = t.ctx.workers.stats.completed;
    const res = await request(app).post("/api/psychrometrics/series").send(body).expect(200);
    expect(t.ctx.workers.stats.completed).toBeGreaterThan(before);
    expect(res.body).toEqual(JSON.parse(JSON.stringify(evaluateSeries(body))));
  });
});
