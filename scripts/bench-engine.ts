// Risk-engine benchmark: evaluateSeries over 1 000 000 readings against a bare loop of
// psychrolib's dew-point solve over the same inputs (target: the engine costs at most 2× per
// reading), then one year of hourly readings (8 760) through the real app's API over loopback
// (target: under 50 ms a request). Run with `npm run bench:engine`.
import { mkdtempSync, rmSync } from "node:fs";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import psychrolib from "psychrolib";
import { evaluateSeries } from "../src/lib/domain/index.js";
import type { SeriesReading } from "../src/lib/domain/index.js";
import { createApp } from "../server/app.js";
import { createAppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { ensureAppDatabase, freePort, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { mulberry32 } from "../server/lib/random.js";

const HOUR_MS = 3_600_000;
const START_MS = Date.UTC(2025, 10, 1); // 1 November 2025, a winter run

/**
 * n hourly-ish readings (55–65 min apart, the odd 4-hour gap) of plausible winter values: air
 * 14–22 °C, RH 45–90 %, outdoor −5–12 °C, a surface between outdoor and indoor (fRsi 0.45–0.85),
 * outdoor RH on most readings. Times are ISO strings, as they arrive over JSON.
 */
function makeReadings(n: number, seed = 20251101): SeriesReading[] {
  const random = mulberry32(seed);
  const readings: SeriesReading[] = new Array(n);
  let t = START_MS;
  for (let i = 0; i < n; i++) {
    t += random() < 0.0005 ? 4 * HOUR_MS : (55 + 10 * random()) * 60_000;
    const day = ((t - START_MS) / HOUR_MS / 24) % 1;
    const outdoor = -5 + 17 * random();
    const air = 14 + 6 * random() + 2 * Math.sin(2 * Math.PI * day);
    const rh = 45 + 45 * random();
    const fRsi = 0.45 + 0.4 * random();
    const reading: SeriesReading = {
      at: new Date(t).toISOString(),
      airTemperatureC: air,
      relativeHumidityPct: rh,
      surfaceTemperatureC: outdoor + fRsi * (air - outdoor),
      outdoorTemperatureC: outdoor,
    };
    if (random() < 0.8) reading.outdoorRelativeHumidityPct = 70 + 30 * random();
    readings[i] = reading;
  }
  return readings;
}

function bareDewPointLoop(readings: readonly SeriesReading[]): number {
  let sum = 0;
  for (let i = 0; i < readings.length; i++) {
    const r = readings[i]!;
    sum += psychrolib.GetTDewPointFromRelHum(r.airTemperatureC, r.relativeHumidityPct / 100);
  }
  return sum;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

function time(run: () => unknown): number {
  const start = performance.now();
  const out = run();
  const ms = performance.now() - start;
  if (out === undefined) throw new Error("benchmark produced nothing");
  return ms;
}

function benchEngine(n = 1_000_000, runs = 5): { engineMs: number; dewPointMs: number; ratio: number } {
  psychrolib.SetUnitSystem(psychrolib.SI);
  const readings = makeReadings(n);
  // Warm up both paths on the same data so the JIT has settled before timing.
  for (let i = 0; i < 2; i++) {
    evaluateSeries({ readings, element: "solid-wall" });
    bareDewPointLoop(readings);
  }
  const engine: number[] = [];
  const dew: number[] = [];
  for (let i = 0; i < runs; i++) {
    // Alternate so drift (thermal, GC) hits both alike.
    engine.push(time(() => evaluateSeries({ readings, element: "solid-wall" })));
    dew.push(time(() => bareDewPointLoop(readings)));
  }
  const engineMs = median(engine);
  const dewPointMs = median(dew);
  return { engineMs, dewPointMs, ratio: engineMs / dewPointMs };
}

/** The whole app (on a throwaway MariaDB, which the route does not touch but the app needs) over loopback. */
async function benchApi(runs = 40): Promise<{ medianMs: number; p95Ms: number; bytes: number }> {
  const dir = mkdtempSync(path.join(tmpdir(), "dewline-bench-db-"));
  const port = await freePort();
  const db = { name: "dewline_bench", user: "dewline_bench", password: "bench-only" };
  try {
    await startMariaDb({ dir, port });
    await ensureAppDatabase({ dir, port }, db);
    const config = loadConfig({
      ...process.env,
      NODE_ENV: "test",
      LOG_LEVEL: "silent",
      DB_PORT: String(port),
      DB_NAME: db.name,
      DB_USER: db.user,
      DB_PASSWORD: db.password,
    });
    const ctx = await createAppContext(config, { migrate: true });
    const server = createApp(ctx).listen(0, "127.0.0.1");
    await new Promise((r) => server.once("listening", r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/psychrometrics/series`;
    const body = JSON.stringify({ readings: makeReadings(8_760), element: "solid-wall" });
    const post = async () => {
      const start = performance.now();
      const res = await fetch(url, { method: "POST", headers: { "content-type": "application/json" }, body });
      await res.json();
      if (res.status !== 200) throw new Error(`API answered ${res.status}`);
      return performance.now() - start;
    };
    for (let i = 0; i < 5; i++) await post();
    const times: number[] = [];
    for (let i = 0; i < runs; i++) times.push(await post());
    times.sort((a, b) => a - b);
    server.closeAllConnections();
    server.close();
    await ctx.close();
    return { medianMs: median(times), p95Ms: times[Math.ceil(0.95 * times.length) - 1]!, bytes: body.length };
  } finally {
    await stopMariaDb(dir);
    rmSync(dir, { recursive: true, force: true });
  }
}

async function main(): Promise<void> {
  const n = 1_000_000;
  const runs = 5;
  const { engineMs, dewPointMs, ratio } = benchEngine(n, runs);
  const perSecond = (ms: number): string => `${Math.round((n / ms) * 1000).toLocaleString("en-GB")} readings/s`;
  const sample = evaluateSeries({ readings: makeReadings(n), element: "solid-wall" });
  console.log(`Risk engine benchmark — ${n.toLocaleString("en-GB")} readings, median of ${runs} runs after warm-up`);
  console.log(`  evaluateSeries                    ${engineMs.toFixed(0).padStart(6)} ms   ${perSecond(engineMs)}`);
  console.log(`  bare GetTDewPointFromRelHum loop  ${dewPointMs.toFixed(0).padStart(6)} ms   ${perSecond(dewPointMs)}`);
  console.log(`  ratio engine / dew-point loop     ${ratio.toFixed(2)}×   (target ≤ 2.00×) ${ratio <= 2 ? "PASS" : "FAIL"}`);
  console.log(
    `  sample: ${sample.count} readings, ${sample.gaps.length} gaps, mould index max ${sample.mouldIndex.max.toFixed(2)}, ` +
      `diagnosis ${sample.diagnosis.kind}`,
  );
  const api = await benchApi();
  console.log(
    `One year of hourly readings (8 760, ${(api.bytes / 1e6).toFixed(1)} MB of JSON) through POST /api/psychrometrics/series, 40 requests:`,
  );
  console.log(
    `  median ${api.medianMs.toFixed(1)} ms, p95 ${api.p95Ms.toFixed(1)} ms   (target < 50 ms) ${api.p95Ms < 50 ? "PASS" : "FAIL"}`,
  );
  if (ratio > 2 || api.p95Ms >= 50) process.exitCode = 1;
}

await main();
