// Big-case and calculator-load benchmark (`npm run bench:big-case`), against the database in the
// environment (e.g. `DB_PORT=13415 npm run db:start` first; the run adds its own landlord and cases):
//  1. GET /api/cases/:id/evaluation of a case with 1 000 000 readings vs a case with 100, median of
//     20 each after the stored result exists, and the first (cold) answer of the big one;
//  2. an officer's GET /api/cases/:id/triage of the big case right after one hand reading is added
//     (its room being worked out again in the background) vs the small case's median, and the big
//     case's priority before and once the newer evaluation is stored;
//  3. p99 of a signed-in GET /api/auth/me, idle vs while 4 anonymous connections post maximal series
//     requests (the anonymous size limit) from one address.
// Everything is measured side by side in one run; the figures are ratios.
import type { AddressInfo } from "node:net";
import { performance } from "node:perf_hooks";
import request from "supertest";
import { createApp } from "../server/app.js";
import { createAppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { makeLandlord, PASSWORD } from "../tests/support/factories.js";

const BIG = Number(process.env.BENCH_READINGS ?? 1_000_000);
const config = loadConfig({ ...process.env, LOG_LEVEL: "silent" });
const ctx = await createAppContext(config, { migrate: true });
const server = createApp(ctx).listen(0, "127.0.0.1");
await new Promise((r) => server.once("listening", r));
const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

const landlord = await makeLandlord(ctx.dataSource);
const agent = request.agent(url);
let csrf = (await agent.get("/api/auth/csrf")).body.csrfToken as string;
csrf = (await agent.post("/api/auth/login").set("X-CSRF-Token", csrf).send({ email: landlord.tenant.email, password: PASSWORD }))
  .body.csrfToken;
const rooms = (await agent.get("/api/me/home")).body.property.rooms as { id: number }[];
// The triage breakdown is for staff: an officer of the same landlord.
const officer = request.agent(url);
const officerCsrf = (await officer.get("/api/auth/csrf")).body.csrfToken as string;
await officer
  .post("/api/auth/login")
  .set("X-CSRF-Token", officerCsrf)
  .send({ email: landlord.officer.email, password: PASSWORD })
  .expect(200);
const roomId = rooms[0]!.id;
const newCase = async () =>
  (
    await agent
      .post("/api/cases")
      .set("X-CSRF-Token", csrf)
      .send({
        description: "Mould on the bedroom wall.",
        locations: ["window"],
        observations: ["condensation"],
        roomIds: [roomId],
      })
  ).body.id as number;

const START = Date.UTC(2023, 0, 1);
async function insert(caseId: number, count: number): Promise<void> {
  for (let s = 0; s < count; s += 20_000) {
    const values: string[] = [];
    for (let k = s; k < Math.min(count, s + 20_000); k++) {
      const t = new Date(START + k * 60_000).toISOString().slice(0, 19).replace("T", " ");
      values.push(
        `(${caseId},${roomId},'${t}',${(17 + (k % 50) / 10).toFixed(2)},${55 + (k % 45)},${(9 + (k % 30) / 10).toFixed(2)},NULL,'import',NULL)`,
      );
    }
    await ctx.dataSource.query(
      "INSERT INTO readings (case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source, import_id) VALUES " +
        values.join(","),
    );
  }
}

const timed = async (fn: () => Promise<unknown>) => {
  const t0 = performance.now();
  await fn();
  return performance.now() - t0;
};
const pct = (xs: number[], p: number) =>
  [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((p / 100) * xs.length))]!;

const small = await newCase();
await insert(small, 100);
const big = await newCase();
console.log(`inserting ${BIG.toLocaleString("en-GB")} readings…`);
await insert(big, BIG);

const evaluation = (id: number) => agent.get(`/api/cases/${id}/evaluation`).expect(200);
const cold = await timed(() => evaluation(big));
await evaluation(small);
const bigTimes: number[] = [];
const smallTimes: number[] = [];
for (let i = 0; i < 20; i++) {
  bigTimes.push(await timed(() => evaluation(big)));
  smallTimes.push(await timed(() => evaluation(small)));
}
const triage = (id: number) => officer.get(`/api/cases/${id}/triage`).expect(200);
await triage(small);
const triageBefore = (await triage(big)).body.score as number;
const smallTriageTimes: number[] = [];
for (let i = 0; i < 20; i++) smallTriageTimes.push(await timed(() => triage(small)));

const addOne = await timed(() =>
  agent
    .post(`/api/cases/${big}/readings`)
    .set("X-CSRF-Token", csrf)
    .send([{ roomId, takenAt: new Date(START + BIG * 60_000).toISOString(), airTemperatureC: 19, relativeHumidityPct: 90 }])
    .expect(201),
);

// The add starts working the big room out again on the pool in the background: the triage breakdown
// and the next view are answered at once from the stored figures (the view marked updating); then
// wait for the pool before "idle".
const triageAfterAdd = await timed(() => triage(big));
let afterAddUpdating: unknown;
const afterAdd = await timed(async () => {
  afterAddUpdating = (await evaluation(big)).body.updating;
});
const settle = await timed(() => ctx.services.readings.whenIdle());
const settled = await timed(() => evaluation(big));
let triageAfter = 0;
const triageSettled = await timed(async () => {
  triageAfter = (await triage(big)).body.score as number;
});

const me = async (n: number) => {
  const xs: number[] = [];
  for (let i = 0; i < n; i++) xs.push(await timed(() => agent.get("/api/auth/me").expect(200)));
  return xs;
};
const idle = await me(300);
const maxAnon = config.calculator.maxAnonymousReadings;
const body = JSON.stringify({
  readings: Array.from({ length: maxAnon }, (_, i) => ({
    at: new Date(START + i * 300_000).toISOString(),
    airTemperatureC: 19,
    relativeHumidityPct: 60 + (i % 40),
    surfaceTemperatureC: 11,
  })),
});
let stop = false;
const statuses = new Map<number, number>();
const attacker = async () => {
  while (!stop) {
    const res = await fetch(`${url}/api/psychrometrics/series`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body,
    });
    await res.arrayBuffer();
    statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
  }
};
const attackers = Array.from({ length: 4 }, attacker);
const loaded = await me(300);
stop = true;
await Promise.all(attackers);

const f = (ms: number) => `${ms.toFixed(1)} ms`;
console.log(`\nevaluation, ${BIG.toLocaleString("en-GB")}-reading case: cold ${f(cold)}, then median ${f(pct(bigTimes, 50))}`);
console.log(`evaluation, 100-reading case: median ${f(pct(smallTimes, 50))}`);
console.log(`  ratio big/small (stored): ×${(pct(bigTimes, 50) / pct(smallTimes, 50)).toFixed(2)}`);
console.log(
  `adding one hand reading to the big case: ${f(addOne)}; next evaluation ${f(afterAdd)} (updating: ${String(afterAddUpdating)})`,
);
console.log(`  background recomputation settled after a further ${f(settle)}; evaluation then ${f(settled)}`);
console.log(
  `triage, big case right after the add: ${f(triageAfterAdd)}; 100-reading case: median ${f(pct(smallTriageTimes, 50))}`,
);
console.log(
  `  ratio big-after-add/small: ×${(triageAfterAdd / pct(smallTriageTimes, 50)).toFixed(2)}; once settled ${f(triageSettled)} (priority ${triageBefore} → ${triageAfter})`,
);
console.log(`/api/auth/me p99 idle ${f(pct(idle, 99))}, under anonymous series load ${f(pct(loaded, 99))}`);
console.log(
  `  ratio loaded/idle: ×${(pct(loaded, 99) / pct(idle, 99)).toFixed(2)}  (series answers: ${JSON.stringify(Object.fromEntries(statuses))})`,
);

server.close();
await ctx.close();
