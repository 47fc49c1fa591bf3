// A case's triage figures (the queue's risk state and priority, the case page's breakdown) come from
// the rooms' stored evaluations: they never wait for a room being worked out again with newer
// readings, and they catch up once the newer result is stored. Room evaluations here run on the
// app's real worker pool, held at a gate the test opens (never a sleep).
import type { Express } from "express";
import { pino } from "pino";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { createServices, type Services } from "../../server/app-context.js";
import { WorkerPool } from "../../server/workers/pool.js";
import type { TaskName, Tasks } from "../../server/workers/tasks.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { msAgo, testClock } from "../support/test-clock.js";

/** The app's worker pool, except that room evaluations wait at a gate while it is held, and fail while told to. */
class GatedPool extends WorkerPool {
  private gate: Promise<void> | null = null;
  private open: () => void = () => undefined;
  /** Room evaluations waiting at the gate now. */
  held = 0;
  failing = false;

  hold(): void {
    this.gate = new Promise((resolve) => (this.open = resolve));
  }

  release(): void {
    this.open();
    this.gate = null;
  }

  override async run<K extends TaskName>(task: K, input: Parameters<Tasks[K]>[0]): Promise<Awaited<ReturnType<Tasks[K]>>> {
    if (task === "evaluateRoomFromDb") {
      if (this.gate) {
        this.held++;
        await this.gate.finally(() => this.held--);
      }
      if (this.failing) throw new Error("the worker thread was lost");
    }
    return super.run(task, input);
  }
}

interface QueueItem {
  id: number;
  riskState: string | null;
  priority: number;
}

let t: TestApp;
let pool: GatedPool;
let services: Services;
let app: Express;
let officer: Client;
let propertyId: number;
let bedroomId: number;
const logged: { level: number; msg: string; caseId?: number; roomId?: number; err?: { message: string } }[] = [];

beforeAll(async () => {
  t = await createTestApp();
  // What the app logs at warn and above, kept to be read back.
  const logger = pino({ level: "warn", base: undefined }, { write: (line: string) => void logged.push(JSON.parse(line)) });
  pool = new GatedPool(t.ctx.config.workers);
  services = createServices(t.ctx.config, t.ctx.dataSource, t.ctx.mailer, logger, testClock, pool);
  app = createApp({ ...t.ctx, logger, workers: pool, services });
  const landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(app, landlord.officer.email, PASSWORD);
  propertyId = landlord.home.id;
  const rooms = (await officer.get(`/api/properties/${propertyId}`).expect(200)).body.rooms as { id: number; kind: string }[];
  bedroomId = rooms.find((r) => r.kind === "bedroom")!.id;
});
afterEach(() => {
  pool.release();
  pool.failing = false;
});
afterAll(async () => {
  pool?.release();
  if (services) {
    await services.readings.whenIdle();
    await services.auth.settled();
    await services.mail.relay.stop();
  }
  await pool?.close();
  await t?.close();
});

const newCase = async () =>
  (
    await officer
      .post("/api/cases", {
        channel: "phone",
        propertyId,
        awareAt: msAgo(86_400_000).toISOString(),
        description: "Mould on the bedroom's outside wall, and the window runs with water in the morning.",
        locations: ["window"],
        observations: ["condensation"],
        roomIds: [bedroomId],
      })
      .expect(201)
  ).body.id as number;

// 21 °C air at 40 % RH has a dew point near 6.9 °C (Magnus formula, from memory), far below a 19.5 °C
// surface: dry. 17 °C at 90 % RH has one near 15.4 °C, above an 11 °C surface: condensing (the same
// pairs as queue.test.ts, checked there against psychrolib).
const dry = (hoursAgo: number) => ({
  roomId: bedroomId,
  takenAt: msAgo(hoursAgo * 3_600_000).toISOString(),
  airTemperatureC: 21,
  relativeHumidityPct: 40,
  surfaceTemperatureC: 19.5,
});
const condensing = (hoursAgo: number) => ({
  roomId: bedroomId,
  takenAt: msAgo(hoursAgo * 3_600_000).toISOString(),
  airTemperatureC: 17,
  relativeHumidityPct: 90,
  surfaceTemperatureC: 11,
});

async function inQueue(caseId: number): Promise<QueueItem> {
  const items = (await officer.get("/api/cases?pageSize=200").expect(200)).body.items as QueueItem[];
  return items.find((i) => i.id === caseId)!;
}

describe("the triage figures of a case whose room is being worked out again", () => {
  it("are answered at once from the stored evaluation, then catch up with the new readings", async () => {
    const caseId = await newCase();
    await officer.post(`/api/cases/${caseId}/readings`, [dry(3)]).expect(201);
    await services.readings.whenIdle();
    const before = await inQueue(caseId);
    expect(before.riskState).toBe("dry");

    // A condensing reading arrives while the room's evaluation cannot finish.
    pool.hold();
    await officer.post(`/api/cases/${caseId}/readings`, [condensing(1)]).expect(201);
    const during = await officer.get(`/api/cases/${caseId}/triage`).expect(200);
    expect(pool.held).toBeGreaterThan(0);
    expect(during.body.score).toBe(before.priority);
    expect(await inQueue(caseId)).toMatchObject({ riskState: "dry", priority: before.priority });

    // Once the newer evaluation is stored, the queue and the breakdown show the condensing surface.
    pool.release();
    await services.readings.whenIdle();
    const after = await inQueue(caseId);
    expect(after.riskState).toBe("condensing");
    expect(after.priority).toBeGreaterThan(before.priority);
    expect((await officer.get(`/api/cases/${caseId}/triage`).expect(200)).body.score).toBe(after.priority);
  });

  it("log a room that could not be worked out again, which the next view works out", async () => {
    const caseId = await newCase();
    await officer.post(`/api/cases/${caseId}/readings`, [dry(3)]).expect(201);
    await services.readings.whenIdle();

    pool.failing = true;
    await officer.post(`/api/cases/${caseId}/readings`, [condensing(1)]).expect(201);
    await services.readings.whenIdle();
    expect(logged.filter((l) => l.level >= 50 && l.caseId === caseId)).toEqual([
      expect.objectContaining({ roomId: bedroomId, err: expect.objectContaining({ message: "the worker thread was lost" }) }),
    ]);

    // The case page still shows the last stored figures, as being brought up to date, and tries again.
    pool.failing = false;
    const stale = await officer.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(stale.body).toMatchObject({ updating: true, rooms: [{ readingsCount: 1 }] });
    await services.readings.whenIdle();
    const current = await officer.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(current.body).toMatchObject({ updating: false, rooms: [{ readingsCount: 2 }] });
    expect((await inQueue(caseId)).riskState).toBe("condensing");
  });
});
