// Officers' queue benchmark (`npm run bench:queue`), on a throwaway MariaDB:
//  1. seeds one landlord with 20 000 homes (2–4 rooms each) over 14 estates, a few staff and
//     100 000 cases over three years (about 12 % open) with 5 000 000 readings, inspections,
//     written summaries and HHSRS assessments, all with LOAD DATA LOCAL INFILE, from a seeded
//     mulberry32 (the same data relative to the run's start time, every run). The stored triage
//     figures are worked out here with the app's own code and checked against the real
//     TriageService.refresh on a sample of cases;
//  2. runs the real app (createAppContext + createApp, in a child process so the load generator
//     does not share its event loop), signs in as an officer and loads GET /api/cases with
//     autocannon, 20 connections for 30 s, cycling through four requests: the default order, a
//     filter, a text search and a deep page. Each response's latency is booked to its request, so
//     every scenario gets its own figures from the one mixed run;
//  3. runs the SQL the QueueService issues (captured from TypeORM, not retyped: a search's homes,
//     then the page's SELECT beside its total) through a mysql2 pool, 20 loops for the same time;
//     also each scenario one request at a time through both, and each query's EXPLAIN;
//  4. side by side: GET /api/auth/me (the lightest signed-in route) and the queue's default page,
//     each with 20 connections, in alternating rounds of the same length;
//  5. opens /queue in headless Chromium and times navigation start → first case row visible, and
//     whether the page asked for /api/auth/me and /api/cases together.
// Targets: API p95 < 50 ms and ≤ 2 × raw p95 + 5 ms under load (the mix and each scenario); one request
// at a time, p95 ≤ 20 ms in every scenario; the default page's throughput ≥ 0.3 × /api/auth/me's; the
// queue page's first rows in < 1 s (median of 5 loads with an empty browser cache) with the two calls
// overlapping. Exit code 1 if any is missed.
// Everything shares one machine, so its CPU count and load average are printed with the figures.
// Options: --duration <seconds> (default 30) for quick runs; --cases <n> scales the data down
// (readings 50 a case, homes one per 5 cases) for trying the script out; --keep leaves the seeded
// MariaDB running at the end, to look at plans by hand.
import { spawn, type ChildProcess } from "node:child_process";
import { closeSync, existsSync, mkdtempSync, openSync, readdirSync, readFileSync, rmSync, statSync, writeSync } from "node:fs";
import type { AddressInfo } from "node:net";
import { createRequire } from "node:module";
import { cpus, loadavg, tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { fileURLToPath } from "node:url";
import mysql from "mysql2/promise";
import { chromium } from "playwright-core";
import { DataSource, type Logger as TypeOrmLogger } from "typeorm";
import { computeDeadlines, ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, type HazardClass } from "../src/lib/domain/deadlines.js";
import { hhsrsScore, LIKELIHOOD_POINTS } from "../src/lib/domain/hhsrs.js";
import { hoursUntilDeadlinePartChanges, triagePriority, type TriageVulnerability } from "../src/lib/domain/triage-priority.js";
import type {
  EvaluationParams,
  ReadingService,
  RoomEvaluationState,
  SeriesPoint,
} from "../server/modules/readings/reading.service.js";
import { evaluateSeries } from "../src/lib/domain/series.js";
import type { CaseStatus } from "../src/lib/domain/case-workflow.js";
import { createApp } from "../server/app.js";
import { createAppContext, createServices } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { createDataSource } from "../server/db/create-data-source.js";
import { createLogger } from "../server/lib/logger.js";
import { createMailer } from "../server/lib/mailer.js";
import { mulberry32 } from "../server/lib/random.js";
import { hashPassword } from "../server/modules/auth/passwords.js";
import type { Actor } from "../server/modules/auth/actor.js";
import { type Case } from "../server/modules/cases/case.entity.js";
import { formatReference } from "../server/modules/cases/case.service.js";
import { EvaluationService } from "../server/modules/evaluation/evaluation.service.js";
import { Organisation } from "../server/modules/organisations/organisation.entity.js";
import { queueQuerySchema } from "../server/modules/cases/case-queue.schemas.js";
import { nextDeadline } from "../server/modules/triage/triage.service.js";
import { User } from "../server/modules/users/user.entity.js";
import { ensureAppDatabase, freePort, loadDataConnection, startMariaDb, stopMariaDb } from "./lib/mariadb.js";
import { projectRoot } from "./lib/paths.js";
import { runStep, stopChild } from "./lib/processes.js";

// ---------------------------------------------------------------------------------------------
// Options and sizes

const argv = process.argv.slice(2);
function option(name: string, fallback: number): number {
  const i = argv.indexOf(`--${name}`);
  if (i === -1) return fallback;
  const value = Number(argv[i + 1]);
  if (!Number.isInteger(value) || value <= 0)
    throw new Error(`--${name} needs a whole number above 0, got ${argv[i + 1] ?? "nothing"}.`);
  return value;
}
const DURATION_S = option("duration", 30);
/** --keep: leave the seeded MariaDB running at the end (its socket is printed), to look at plans by hand. */
const KEEP = argv.includes("--keep");
const CASES = option("cases", 100_000);
const READINGS = CASES * 50;
const HOMES = Math.max(50, Math.round(CASES / 5));
const CONNECTIONS = 20;
const WARM_UP_S = 5;
/** The side-by-side throughput runs: this many rounds of each route, alternating, DURATION_S in all per route. */
const SIDE_BY_SIDE_ROUNDS = 3;
const THROUGHPUT_RATIO_TARGET = 0.3;
const SINGLE_P95_TARGET_MS = 20;
const RENDER_LOADS = 5;

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;
const YEAR_MS = 365 * DAY_MS;
const PASSWORD = "bench-only-password";
const SEARCH = "Larkspur";
/** Page 2000 of 25 with the full data: half way down every case. */
const DEEP_PAGE = Math.min(2000, Math.floor(CASES / 50));

/** The four requests of the mix. */
const SCENARIOS = [
  { name: "default order", query: "status=open" },
  { name: "filter", query: "status=open&vulnerable=true&overdue=true" },
  { name: "text search", query: `q=${SEARCH}` },
  { name: "deep page", query: `page=${DEEP_PAGE}&pageSize=25` },
];

// ---------------------------------------------------------------------------------------------
// A fictional landlord of our own: estates, streets and blocks are invented for this benchmark.

const ESTATES = [
  {
    estate: "Alderbrook",
    town: "Corrowby",
    outward: "ZQ1",
    streets: ["Larkspur Walk", "Tansy Close", "Wherry Lane", "Oriel Road"],
    blocks: ["Pennant House"],
  },
  {
    estate: "Brackenfold",
    town: "Corrowby",
    outward: "ZQ2",
    streets: ["Sedge Row", "Bittern Way", "Fallow Street"],
    blocks: ["Marram Court", "Teasel House"],
  },
  {
    estate: "Cinder Hill",
    town: "Corrowby",
    outward: "ZQ3",
    streets: ["Kiln Street", "Flint Terrace", "Smithy Lane", "Forge Road"],
    blocks: [],
  },
  {
    estate: "Dunmere Park",
    town: "Halvering",
    outward: "ZQ4",
    streets: ["Plover Avenue", "Reedling Close", "Mere Road"],
    blocks: ["Coot House"],
  },
  { estate: "Eastwold", town: "Halvering", outward: "ZQ5", streets: ["Quarry Lane", "Barrow Street", "Chalk Walk"], blocks: [] },
  {
    estate: "Fernhollow",
    town: "Halvering",
    outward: "ZQ6",
    streets: ["Bracken Rise", "Hart Close", "Glade Road", "Spinney Way"],
    blocks: ["Oakmoss Court"],
  },
  {
    estate: "Gannet Quay",
    town: "Saltmarsh",
    outward: "ZQ7",
    streets: ["Harbour Row", "Netloft Lane"],
    blocks: ["Slipway House", "Capstan House", "Tideway Court"],
  },
  {
    estate: "Highcombe",
    town: "Saltmarsh",
    outward: "ZQ8",
    streets: ["Combe Road", "Heather Street", "Lookout Lane"],
    blocks: [],
  },
  {
    estate: "Ironbridge Row",
    town: "Saltmarsh",
    outward: "ZQ9",
    streets: ["Rivet Street", "Girder Way", "Canal Side"],
    blocks: ["Lockkeeper House"],
  },
  {
    estate: "Juniper Fields",
    town: "Wrenstead",
    outward: "ZR1",
    streets: ["Juniper Walk", "Yarrow Close", "Meadow Lane", "Thistle Road"],
    blocks: [],
  },
  {
    estate: "Kettleby",
    town: "Wrenstead",
    outward: "ZR2",
    streets: ["Copper Street", "Ewer Lane", "Hob Terrace"],
    blocks: ["Trivet House"],
  },
  { estate: "Lowfield", town: "Wrenstead", outward: "ZR3", streets: ["Drain Lane", "Osier Road", "Willow Terrace"], blocks: [] },
  {
    estate: "Mossgate",
    town: "Pellwick",
    outward: "ZR4",
    streets: ["Lichen Way", "Stonecrop Close", "Gate Street"],
    blocks: ["Sphagnum House", "Bryony Court"],
  },
  { estate: "Northbeck", town: "Pellwick", outward: "ZR5", streets: ["Beck Side", "Ghyll Road", "Fellgate"], blocks: [] },
] as const;

const WALLS = [
  "solid-brick",
  "solid-brick",
  "solid-stone",
  "unfilled-cavity",
  "filled-cavity",
  "filled-cavity",
  "system-built",
  "timber-frame",
  "insulated",
] as const;
const GLAZING = [
  "single",
  "old-double",
  "old-double",
  "modern-double",
  "modern-double",
  "modern-double",
  "triple",
  "mixed",
] as const;
const HEATING = [
  "gas-boiler",
  "gas-boiler",
  "gas-boiler",
  "electric-storage",
  "electric-direct",
  "heat-pump",
  "district",
] as const;
const ROOMS = [
  { name: "Living room", kind: "living" },
  { name: "Bedroom", kind: "bedroom" },
  { name: "Kitchen", kind: "kitchen" },
  { name: "Bathroom", kind: "bathroom" },
] as const;
const STAFF = [
  { name: "Amira Holt", role: "officer" },
  { name: "Ben Ashworth", role: "officer" },
  { name: "Carys Penn", role: "officer" },
  { name: "Dev Maitland", role: "officer" },
  { name: "Elin Rowe", role: "officer" },
  { name: "Femi Lacey", role: "officer" },
  { name: "Gus Tranter", role: "maintenance" },
  { name: "Hana Sole", role: "maintenance" },
] as const;
const LOCATIONS = [
  "window",
  "external-wall",
  "ceiling",
  "corner",
  "behind-furniture",
  "floor",
  "bath-or-shower",
  "other",
] as const;
const OBSERVATIONS = ["condensation", "mould-spots", "musty-smell", "peeling-paint", "wet-patches", "leak"] as const;
const DURATIONS = ["days", "weeks", "months", "over-a-year", "not-sure"] as const;
const AREAS = ["hand", "a4", "a4", "door", "larger"] as const;
const VULNERABILITIES = ["children-under-15", "over-65", "breathing-or-immune", "pregnancy", "disability"] as const;
const DESCRIPTIONS = [
  "Black spots on the bedroom wall behind the wardrobe.",
  "Windows running with water every morning; the sills stay wet.",
  "Musty smell in the kitchen and the paint is peeling by the back door.",
  "Mould in the bathroom ceiling corner that comes back after cleaning.",
  "Damp patch on the outside wall of the living room, getting bigger.",
  "Water coming through around the window frame when it rains.",
] as const;

// ---------------------------------------------------------------------------------------------
// Small helpers

const random = mulberry32(20260115);
const chance = (p: number) => random() < p;
const between = (a: number, b: number) => a + (b - a) * random();
const pick = <T>(values: readonly T[]): T => values[Math.floor(random() * values.length)]!;
/** Between min and max distinct values, in a random order (a partial Fisher–Yates shuffle). */
const some = <T>(values: readonly T[], min: number, max: number): T[] => {
  const n = min + Math.floor(random() * (max - min + 1));
  const out = [...values];
  for (let i = 0; i < n; i++) {
    const j = i + Math.floor(random() * (out.length - i));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out.slice(0, n);
};
const fmt = (n: number) => Math.round(n).toLocaleString("en-GB");
const ms1 = (n: number) => n.toFixed(1);

/** DATETIME(3) text in UTC, as LOAD DATA takes it. */
const sqlTime = (d: Date) => d.toISOString().slice(0, 23).replace("T", " ");
const sqlSeconds = (d: Date) => d.toISOString().slice(0, 19).replace("T", " ");
/** One LOAD DATA line: tab-separated, \N for NULL, backslash, tab and newline escaped. */
const line = (values: (string | number | boolean | null)[]) =>
  values
    .map((v) =>
      v === null
        ? "\\N"
        : typeof v === "boolean"
          ? v
            ? "1"
            : "0"
          : String(v).replace(/[\\\t\n]/g, (c) => (c === "\t" ? "\\t" : c === "\n" ? "\\n" : "\\\\")),
    )
    .join("\t") + "\n";

/** A file written in chunks, never held whole in memory. */
class TsvFile {
  private fd: number;
  private buffer: string[] = [];
  rows = 0;
  constructor(readonly file: string) {
    this.fd = openSync(file, "w");
  }
  add(values: (string | number | boolean | null)[]) {
    this.buffer.push(line(values));
    this.rows++;
    if (this.buffer.length >= 20_000) this.flush();
  }
  flush() {
    if (this.buffer.length) writeSync(this.fd, this.buffer.join(""));
    this.buffer = [];
  }
  close() {
    this.flush();
    closeSync(this.fd);
  }
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))]!;
}

interface Latencies {
  count: number;
  p50: number;
  p95: number;
  p99: number;
  perSecond: number;
}
function summarise(values: number[], seconds: number): Latencies {
  const sorted = [...values].sort((a, b) => a - b);
  return {
    count: sorted.length,
    p50: percentile(sorted, 0.5),
    p95: percentile(sorted, 0.95),
    p99: percentile(sorted, 0.99),
    perSecond: sorted.length / seconds,
  };
}

// ---------------------------------------------------------------------------------------------
// 1. Seeding

interface SeedHome {
  id: number;
  glazingType: (typeof GLAZING)[number];
  wallType: (typeof WALLS)[number];
  rooms: { id: number; name: string }[];
}

interface SeedCase {
  id: number;
  home: SeedHome;
  awareAt: Date;
  status: CaseStatus;
  hazardClass: HazardClass | null;
  inspectedAt: Date | null;
  summarySentAt: Date | null;
  category: 1 | 2 | null;
  band: string | null;
  recurrence: boolean;
}

export interface Seeded {
  officer: Actor;
  caseIds: { open: number[]; closed: number[] };
  counts: {
    homes: number;
    rooms: number;
    cases: number;
    open: number;
    readings: number;
    inspections: number;
    summaries: number;
    assessments: number;
  };
  generateMs: number;
  loadTimes: string[];
}

const OPEN: CaseStatus[] = ["new", "triaged", "inspection-booked", "investigated", "works-planned", "works-done", "monitoring"];
const OPEN_WEIGHTS = [0.2, 0.18, 0.14, 0.14, 0.16, 0.08, 0.1];
const AFTER_INSPECTION = new Set<CaseStatus>(["investigated", "works-planned", "works-done", "monitoring", "closed"]);

function openStatus(): CaseStatus {
  let r = random();
  for (let i = 0; i < OPEN.length; i++) {
    r -= OPEN_WEIGHTS[i]!;
    if (r < 0) return OPEN[i]!;
  }
  return "monitoring";
}

/** A valid HHSRS hazard-1 judgement: three classes on representative points, class IV the remainder. */
function assessment() {
  const likelihood = pick(LIKELIHOOD_POINTS.filter((l) => l >= 10 && l <= 1000));
  const o1 = pick([0, 0, 0.1, 0.2, 0.5, 1.0, 2.2]);
  const o2 = pick([0.1, 0.5, 1.0, 2.2, 4.6, 10.0]);
  const o3 = pick([2.2, 4.6, 10.0, 21.5, 46.4]);
  const tenths = 1000 - Math.round(o1 * 10) - Math.round(o2 * 10) - Math.round(o3 * 10);
  const spread: [number, number, number, number] = [o1, o2, o3, tenths / 10];
  return { likelihood, spread, ...hhsrsScore({ likelihood, spread }) };
}

/**
 * Readings for one case: roughly hourly from a day or two after the report, split over the case's
 * rooms, in the order seriesFor returns them. The values are rounded to the column's two decimals
 * here, so the figures are worked out from exactly what MariaDB will hold.
 */
function readingsFor(
  c: { awareAt: Date; rooms: { id: number; name: string }[] },
  count: number,
  now: Date,
  damp: number,
): Map<number, SeriesPoint[]> {
  const out = new Map<number, SeriesPoint[]>();
  const perRoom = c.rooms.map((_, i) => Math.floor(count / c.rooms.length) + (i < count % c.rooms.length ? 1 : 0));
  const span = Math.max(...perRoom) * 65 * 60_000;
  let start = c.awareAt.getTime() + between(0.5, 3) * DAY_MS;
  if (start + span > now.getTime() - HOUR_MS) start = now.getTime() - HOUR_MS - span;
  const month = new Date(start).getUTCMonth();
  const winter = month >= 10 || month <= 2;
  const outdoorBase = winter ? between(-3, 8) : between(6, 17);
  const hasOutdoor = chance(0.8);
  const measuredSurface = chance(0.15);
  c.rooms.forEach((room, r) => {
    const series: SeriesPoint[] = [];
    const airBase = between(15, 21);
    const rhBase = 46 + 36 * damp + (room.name === "Bathroom" || room.name === "Kitchen" ? 5 : 0);
    const fRsi = between(0.45, 0.85);
    let t = Math.floor(start / 1000) * 1000;
    for (let i = 0; i < perRoom[r]!; i++) {
      t += Math.round(between(55, 65) * 60) * 1000;
      const day = (t % DAY_MS) / DAY_MS;
      const air = Number((airBase + 1.5 * Math.sin(2 * Math.PI * day) + between(-0.3, 0.3)).toFixed(2));
      const rh = Number(Math.min(99, Math.max(20, rhBase + 8 * Math.sin(2 * Math.PI * (day + 0.3)) + between(-2, 2))).toFixed(2));
      const point: SeriesPoint = { at: new Date(t), airTemperatureC: air, relativeHumidityPct: rh };
      if (hasOutdoor)
        point.outdoorTemperatureC = Number((outdoorBase + 3 * Math.sin(2 * Math.PI * day) + between(-0.5, 0.5)).toFixed(2));
      if (measuredSurface) {
        const outdoor = point.outdoorTemperatureC ?? outdoorBase;
        point.surfaceTemperatureC = Number((outdoor + fRsi * (air - outdoor)).toFixed(2));
      }
      series.push(point);
    }
    out.set(room.id, series);
  });
  return out;
}

/** Seeds the benchmark landlord (also used by bench:insight). */
export async function seed(
  ds: DataSource,
  db: { host: string; port: number; user: string; password: string; name: string },
  dir: string,
  now: Date,
): Promise<Seeded> {
  const started = performance.now();
  const org = await ds.getRepository(Organisation).save({ name: "Corrowby and Pellwick Homes (benchmark)" });
  const passwordHash = await hashPassword(PASSWORD);
  const staff: User[] = [];
  for (const [i, s] of STAFF.entries()) {
    const email = `${s.name.split(" ")[0]!.toLowerCase()}@bench.example`;
    staff.push(
      await ds.getRepository(User).save(
        ds.getRepository(User).create({
          organisationId: org.id,
          email,
          name: s.name,
          role: s.role,
          status: "active",
          passwordHash: i === 0 ? passwordHash : null,
        }),
      ),
    );
  }
  const officers = staff.filter((u) => u.role === "officer");

  // Homes and rooms, with explicit ids (the tables are empty), so cases can point at them.
  const homesFile = new TsvFile(path.join(dir, "properties.tsv"));
  const roomsFile = new TsvFile(path.join(dir, "rooms.tsv"));
  const homes: SeedHome[] = [];
  const numbers = new Map<string, number>();
  let roomId = 0;
  for (let id = 1; id <= HOMES; id++) {
    const plan = ESTATES[id % ESTATES.length]!;
    const flat = plan.blocks.length > 0 && chance(0.35);
    const block = flat ? pick(plan.blocks) : null;
    const street = flat ? block! : pick(plan.streets);
    const number = (numbers.get(street) ?? 0) + 1;
    numbers.set(street, number);
    const builtForm = flat
      ? "flat"
      : pick(["mid-terrace", "mid-terrace", "end-terrace", "semi-detached", "bungalow", "maisonette"] as const);
    const home: SeedHome = { id, glazingType: pick(GLAZING), wallType: pick(WALLS), rooms: [] };
    const postcode = `${plan.outward} ${(id % 9) + 1}${"ABDEFGHJLNPQRSTUWXYZ"[id % 20]}${"ABDEFGHJLNPQRSTUWXYZ"[Math.floor(id / 20) % 20]}`;
    homesFile.add([
      id,
      org.id,
      flat ? `Flat ${number}, ${block}` : `${number} ${street}`,
      null,
      plan.town,
      postcode,
      String(991000000000 + id),
      plan.estate,
      block,
      builtForm,
      home.wallType,
      home.glazingType,
      pick(HEATING),
    ]);
    const roomCount = 2 + Math.floor(random() * 3);
    for (const r of ROOMS.slice(0, roomCount)) {
      roomId++;
      home.rooms.push({ id: roomId, name: r.name });
      roomsFile.add([roomId, id, r.name, r.kind]);
    }
    homes.push(home);
  }
  homesFile.close();
  roomsFile.close();

  // The cases' facts first (recurrence needs every case at a home before any figure is worked out).
  // Most homes see a case now and then; a fifth of them are the damp-prone ones that see most.
  const problemHomes = homes.slice(0, Math.round(HOMES / 5));
  const cases: SeedCase[] = [];
  for (let id = 1; id <= CASES; id++) {
    const open = chance(0.12);
    // Open cases are mostly recent, with a tail of old ones still running; closed ones spread over three years.
    const ageDays = open
      ? chance(0.55)
        ? between(0.02, 14)
        : chance(0.55)
          ? between(14, 90)
          : between(90, 3 * 365)
      : between(7, 3 * 365);
    const ageMs = ageDays * DAY_MS;
    const awareAt = new Date(Math.round(now.getTime() - ageMs));
    const status: CaseStatus = open ? openStatus() : chance(0.88) ? "closed" : "cancelled";
    const hazardClass: HazardClass | null =
      status === "new" && chance(0.7)
        ? null
        : status === "cancelled" && chance(0.6)
          ? null
          : pick(["emergency", "significant", "significant", "significant", "not-significant", "not-significant"] as const);
    let inspectedAt: Date | null = null;
    if (AFTER_INSPECTION.has(status) && (status !== "closed" || chance(0.9))) {
      inspectedAt = new Date(
        Math.min(
          awareAt.getTime() + between(0.3, 18) * DAY_MS,
          awareAt.getTime() + (now.getTime() - awareAt.getTime()) * between(0.2, 0.9),
        ),
      );
    }
    const summarySentAt = inspectedAt && chance(0.85) ? new Date(inspectedAt.getTime() + between(0.2, 6) * DAY_MS) : null;
    cases.push({
      id,
      home: chance(0.35) ? pick(problemHomes) : pick(homes),
      awareAt,
      status,
      hazardClass,
      inspectedAt,
      summarySentAt: summarySentAt && summarySentAt.getTime() < now.getTime() ? summarySentAt : null,
      category: null,
      band: null,
      recurrence: false,
    });
  }
  // Recurrence: another case at the same home aware within 12 months either side (as TriageService asks).
  const byHome = new Map<number, SeedCase[]>();
  for (const c of cases) byHome.set(c.home.id, [...(byHome.get(c.home.id) ?? []), c]);
  for (const list of byHome.values()) {
    list.sort((a, b) => a.awareAt.getTime() - b.awareAt.getTime());
    list.forEach((c, i) => {
      const before = list[i - 1];
      const after = list[i + 1];
      c.recurrence =
        (before !== undefined && c.awareAt.getTime() - before.awareAt.getTime() <= YEAR_MS) ||
        (after !== undefined && after.awareAt.getTime() - c.awareAt.getTime() <= YEAR_MS);
    });
  }

  // The figures, case by case, with the same code the app uses. EvaluationService.riskOf is the
  // real risk engine over a case's rooms; here it reads the readings just generated instead of
  // the table they are about to be loaded into.
  let pending = new Map<number, SeriesPoint[]>();
  // The evaluation reads stored per-room results; here each room's is worked out from the pending readings.
  const readingSource = {
    roomEvaluations: async (_caseId: number, roomIds: readonly number[], params: EvaluationParams) =>
      new Map(
        roomIds.map((roomId) => {
          const series = pending.get(roomId) ?? [];
          const last = series.at(-1);
          const state: RoomEvaluationState = {
            updating: false,
            evaluatedAt: null,
            evaluation: {
              readingsCount: series.length,
              latest: last
                ? {
                    takenAt: last.at.toISOString(),
                    airTemperatureC: last.airTemperatureC,
                    relativeHumidityPct: last.relativeHumidityPct,
                    surfaceTemperatureC: last.surfaceTemperatureC ?? null,
                    outdoorTemperatureC: last.outdoorTemperatureC ?? null,
                  }
                : null,
              series: series.length ? evaluateSeries({ readings: series, ...params }) : null,
            },
          };
          return [roomId, state];
        }),
      ),
  } as unknown as ReadingService;
  const config = loadConfig({ ...process.env, NODE_ENV: "test" });
  const evaluation = new EvaluationService(
    createServices(config, ds, createMailer(config), createLogger("silent")).cases,
    readingSource,
  );

  const withReadings = cases.filter(() => chance(0.92));
  const readingsOf = new Map<number, number>(
    withReadings.map((c, i) => [c.id, Math.floor(READINGS / withReadings.length) + (i < READINGS % withReadings.length ? 1 : 0)]),
  );

  const casesFile = new TsvFile(path.join(dir, "cases.tsv"));
  const caseRoomsFile = new TsvFile(path.join(dir, "case_rooms.tsv"));
  const readingsFile = new TsvFile(path.join(dir, "readings.tsv"));
  const inspectionsFile = new TsvFile(path.join(dir, "inspections.tsv"));
  const summariesFile = new TsvFile(path.join(dir, "written_summaries.tsv"));
  const assessmentsFile = new TsvFile(path.join(dir, "hhsrs_assessments.tsv"));
  const caseIds = { open: [] as number[], closed: [] as number[] };
  for (const c of cases) {
    const isOpen = OPEN.includes(c.status);
    (isOpen ? caseIds.open : caseIds.closed).push(c.id);
    const locations = some(LOCATIONS, 1, 3);
    const observations = some(OBSERVATIONS, 1, 3);
    const vulnerability: TriageVulnerability[] | null = chance(0.15) ? null : chance(0.62) ? [] : some(VULNERABILITIES, 1, 2);
    const area = chance(0.1) ? null : pick(AREAS);
    const rooms = some(c.home.rooms, 1, Math.min(2, c.home.rooms.length)).sort((a, b) => a.id - b.id);
    const assignee = isOpen ? (chance(0.7) ? pick(officers).id : null) : chance(0.95) ? pick(officers).id : null;
    const channel = pick([
      "tenant-online",
      "tenant-online",
      "tenant-online",
      "tenant-online",
      "phone",
      "phone",
      "email",
      "letter",
      "visit",
    ] as const);

    for (const r of rooms) caseRoomsFile.add([c.id, r.id]);
    if (c.inspectedAt) {
      inspectionsFile.add([
        c.id,
        sqlTime(c.inspectedAt),
        pick(officers).id,
        pick(["condensation", "condensation", "penetrating-damp", "plumbing-leak", "roof-gutter", "other-unknown"]),
        pick(["none", "under-1-m2", "1-to-5-m2", "over-5-m2"]),
        "Seeded inspection for the benchmark.",
        "[]",
        sqlTime(c.inspectedAt),
      ]);
      if (chance(0.75)) {
        const versions = chance(0.1) ? 2 : 1;
        for (let v = 1; v <= versions; v++) {
          const a = assessment();
          assessmentsFile.add([
            c.id,
            v,
            pick(officers).id,
            a.likelihood,
            JSON.stringify(a.spread),
            "Seeded assessment for the benchmark.",
            a.score,
            a.band,
            a.category,
            sqlTime(new Date(c.inspectedAt.getTime() + v * HOUR_MS)),
          ]);
          c.band = a.band;
          c.category = a.category;
        }
      }
    }
    if (c.summarySentAt)
      summariesFile.add([c.id, pick(officers).id, "Seeded written summary for the benchmark.", null, sqlTime(c.summarySentAt)]);

    const count = readingsOf.get(c.id) ?? 0;
    pending = count ? readingsFor({ awareAt: c.awareAt, rooms }, count, now, random()) : new Map();
    for (const [rid, series] of pending) {
      for (const p of series)
        readingsFile.add([
          c.id,
          rid,
          sqlSeconds(p.at as Date),
          p.airTemperatureC.toFixed(2),
          p.relativeHumidityPct.toFixed(2),
          p.surfaceTemperatureC?.toFixed(2) ?? null,
          p.outdoorTemperatureC?.toFixed(2) ?? null,
          "import",
        ]);
    }

    // What TriageService.refresh stores (server/modules/triage/triage.service.ts, factsFor and
    // refresh), worked out from the same facts with the same functions: riskOf over the rooms'
    // readings, computeDeadlines with the default policy (no landlord policy row is seeded) and
    // the first inspection and summary as milestones, nextDeadline, triagePriority, and
    // triage_due_at at the next step of the deadline factor (1 ms past it) or NULL when none
    // comes. verifyFigures() below checks this against the real refresh on a sample.
    const risk = await evaluation.riskOf({ id: c.id, locations, observations, property: c.home } as unknown as Case);
    const deadlines = computeDeadlines({
      hazardClass: c.hazardClass,
      awareAt: c.awareAt,
      investigationEndedAt: c.inspectedAt,
      summarySentAt: c.summarySentAt,
      now,
      policy: ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY,
    });
    const next = nextDeadline(c.status, deadlines);
    const hoursUntilDeadline = next ? (next.dueAt!.getTime() - now.getTime()) / HOUR_MS : null;
    const priority = triagePriority({
      surfaceState: risk.state ?? "unknown",
      mouldIndex: risk.mouldIndex,
      affectedArea: area ?? "unknown",
      vulnerabilities: vulnerability === null ? "skipped" : vulnerability,
      hhsrsCategory: c.category,
      recurrence: c.recurrence,
      hoursUntilDeadline,
      emergency: c.hazardClass === "emergency",
      // The benchmark seeds no "it got worse" reports.
      hoursSinceReportedWorse: null,
    });
    const changesInHours = hoursUntilDeadlinePartChanges(hoursUntilDeadline);
    const triageDueAt = changesInHours === null ? null : new Date(now.getTime() + changesInHours * HOUR_MS + 1);
    const updatedAt = new Date(Math.max(c.awareAt.getTime(), c.summarySentAt?.getTime() ?? 0, c.inspectedAt?.getTime() ?? 0));
    casesFile.add([
      c.id,
      formatReference(c.awareAt, c.id),
      org.id,
      c.home.id,
      pick(officers).id,
      null,
      channel,
      sqlTime(c.awareAt),
      pick(DESCRIPTIONS),
      JSON.stringify(locations),
      JSON.stringify(observations),
      pick(DURATIONS),
      area,
      vulnerability === null ? null : JSON.stringify(vulnerability),
      (vulnerability?.length ?? 0) > 0,
      chance(0.5)
        ? JSON.stringify({
            heatingUsable: pick(["yes", "sometimes", "no"]),
            extractorFanWorks: pick(["yes", "no", "none-fitted", "not-sure"]),
          })
        : null,
      c.status,
      assignee,
      c.hazardClass,
      c.hazardClass ? "Classified from the report and the readings (benchmark data)." : null,
      null,
      risk.state,
      risk.mouldIndex === null ? null : (Math.round(risk.mouldIndex * 100) / 100).toFixed(2),
      c.band,
      c.category,
      c.recurrence,
      priority.score,
      next?.stage ?? null,
      next ? sqlTime(next.dueAt!) : null,
      triageDueAt ? sqlTime(triageDueAt) : null,
      sqlTime(c.awareAt),
      sqlTime(updatedAt),
    ]);
  }
  for (const f of [casesFile, caseRoomsFile, readingsFile, inspectionsFile, summariesFile, assessmentsFile]) f.close();
  const generateMs = performance.now() - started;

  const loader = await loadDataConnection(db);
  const loadTimes: string[] = [];
  try {
    const load = async (f: TsvFile, table: string, columns: string) => {
      const start = performance.now();
      const [result] = await loader.query({
        sql: `LOAD DATA LOCAL INFILE ? INTO TABLE ${table} CHARACTER SET utf8mb4 FIELDS TERMINATED BY '\\t' LINES TERMINATED BY '\\n' (${columns})`,
        values: [f.file],
      });
      const { affectedRows, warningStatus } = result as { affectedRows: number; warningStatus: number };
      if (warningStatus > 0) {
        const [warnings] = await loader.query("SHOW WARNINGS LIMIT 5");
        throw new Error(`LOAD DATA into ${table} gave ${warningStatus} warnings: ${JSON.stringify(warnings)}`);
      }
      if (affectedRows !== f.rows) throw new Error(`LOAD DATA into ${table} loaded ${affectedRows} of ${f.rows} rows.`);
      loadTimes.push(`${table} ${((performance.now() - start) / 1000).toFixed(1)} s`);
    };
    await load(
      homesFile,
      "properties",
      "id, organisation_id, address_line1, address_line2, town, postcode, uprn, estate, block, built_form, wall_type, glazing_type, heating_type",
    );
    await load(roomsFile, "rooms", "id, property_id, name, kind");
    await load(
      casesFile,
      "cases",
      "id, reference, organisation_id, property_id, reporter_user_id, tenant_user_id, channel, aware_at, description, locations, observations, since, area, vulnerability, vulnerable_household, equipment, status, " +
        "assignee_user_id, hazard_class, hazard_class_reason, officers_alerted_at, risk_state, mould_index, hhsrs_band, hhsrs_category, recurrence, priority, next_stage, next_due_at, triage_due_at, created_at, updated_at",
    );
    await load(caseRoomsFile, "case_rooms", "case_id, room_id");
    await load(
      inspectionsFile,
      "inspections",
      "case_id, inspected_at, inspector_user_id, cause, mould_extent, findings, room_readings, created_at",
    );
    await load(summariesFile, "written_summaries", "case_id, sender_user_id, body, outbox_id, sent_at");
    await load(
      assessmentsFile,
      "hhsrs_assessments",
      "case_id, version, assessor_user_id, likelihood, spread, justification, score, band, category, created_at",
    );
    await load(
      readingsFile,
      "readings",
      "case_id, room_id, taken_at, air_temperature_c, relative_humidity_pct, surface_temperature_c, outdoor_temperature_c, source",
    );
    await loader.query(
      "ANALYZE TABLE properties, rooms, cases, case_rooms, inspections, written_summaries, hhsrs_assessments, readings",
    );
  } finally {
    await loader.end();
  }
  for (const f of [homesFile, roomsFile, casesFile, caseRoomsFile, readingsFile, inspectionsFile, summariesFile, assessmentsFile])
    rmSync(f.file, { force: true });

  const officer = staff[0]!;
  return {
    officer: { id: officer.id, email: officer.email, name: officer.name, role: officer.role, organisationId: org.id },
    caseIds,
    counts: {
      homes: homesFile.rows,
      rooms: roomsFile.rows,
      cases: casesFile.rows,
      open: caseIds.open.length,
      readings: readingsFile.rows,
      inspections: inspectionsFile.rows,
      summaries: summariesFile.rows,
      assessments: assessmentsFile.rows,
    },
    generateMs,
    loadTimes,
  };
}

// ---------------------------------------------------------------------------------------------
// Checking the seeded figures against the real TriageService.refresh

const FIGURES = [
  "risk_state",
  "mould_index",
  "hhsrs_band",
  "hhsrs_category",
  "recurrence",
  "priority",
  "next_stage",
  "next_due_at",
  "triage_due_at",
] as const;
type Figures = Record<(typeof FIGURES)[number], unknown>;

async function verifyFigures(ds: DataSource, seeded: Seeded): Promise<{ checked: number; open: number; moved: number }> {
  const config = loadConfig({ ...process.env, NODE_ENV: "test" });
  const triage = createServices(config, ds, createMailer(config), createLogger("silent")).triage;
  const sample = mulberry32(7);
  const choose = (ids: number[], n: number) =>
    Array.from({ length: Math.min(n, ids.length) }, () => ids[Math.floor(sample() * ids.length)]!);
  const ids = [...new Set([...choose(seeded.caseIds.open, 14), ...choose(seeded.caseIds.closed, 6)])];
  const read = async (id: number): Promise<Figures> => {
    const [row] = await ds.query(`SELECT ${FIGURES.join(", ")} FROM cases WHERE id = ?`, [id]);
    return row as Figures;
  };
  const problems: string[] = [];
  let moved = 0;
  for (const id of ids) {
    const before = await read(id);
    const now = new Date();
    // A step of the deadline factor passed between seeding and now: the stored figure was due to
    // be worked out again (as the app would see it), so it may rightly differ; counted, not compared.
    const due = before.triage_due_at !== null && new Date(before.triage_due_at as Date).getTime() <= now.getTime();
    if (due) moved++;
    await triage.refresh(id, now);
    const after = await read(id);
    for (const f of FIGURES) {
      const a = before[f] instanceof Date ? (before[f] as Date).getTime() : before[f];
      const b = after[f] instanceof Date ? (after[f] as Date).getTime() : after[f];
      // triage_due_at is (due time − step) + 1 ms from either clock; floating point may move the last millisecond.
      const same =
        f === "triage_due_at" && typeof a === "number" && typeof b === "number" ? Math.abs(a - b) <= 2 : String(a) === String(b);
      if (!same && !due) problems.push(`case ${id}: ${f} seeded ${String(before[f])}, refresh stored ${String(after[f])}`);
    }
  }
  if (problems.length)
    throw new Error(`The seeded triage figures differ from TriageService.refresh:\n  ${problems.join("\n  ")}`);
  return { checked: ids.length - moved, open: ids.filter((id) => seeded.caseIds.open.includes(id)).length, moved };
}

// ---------------------------------------------------------------------------------------------
// 2. The app, in its own process

const SERVE_FLAG = "--serve-app";

/** Child-process mode: the real app against the benchmark database until the parent stops it. */
async function serveApp(): Promise<void> {
  const config = loadConfig(process.env);
  const ctx = await createAppContext(config);
  const server = createApp(ctx).listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    server.closeAllConnections();
    server.close();
    await ctx.close();
    process.exit(0);
  };
  process.on("SIGTERM", stop);
  process.on("disconnect", stop);
  process.send!({ port: (server.address() as AddressInfo).port });
}

async function startApp(db: {
  port: number;
  name: string;
  user: string;
  password: string;
}): Promise<{ child: ChildProcess; url: string; errors: string[] }> {
  const child = spawn(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), SERVE_FLAG], {
    env: {
      ...process.env,
      NODE_ENV: "production",
      // Only errors, kept by the parent and shown if requests failed.
      LOG_LEVEL: "error",
      APP_URL: "http://127.0.0.1",
      SESSION_SECRET: "bench-queue-session-secret-only-for-this-run",
      DB_HOST: "127.0.0.1",
      DB_PORT: String(db.port),
      DB_NAME: db.name,
      DB_USER: db.user,
      DB_PASSWORD: db.password,
      CLIENT_DIST_DIR: path.join(projectRoot, "dist"),
    },
    stdio: ["ignore", "pipe", "inherit", "ipc"],
  });
  const errors: string[] = [];
  let errorCount = 0;
  child.stdout!.setEncoding("utf8").on("data", (chunk: string) => {
    for (const l of chunk.split("\n").filter(Boolean)) if (errorCount++ < 5) errors.push(l.slice(0, 500));
  });
  const port = await new Promise<number>((resolve, reject) => {
    child.once("message", (m) => resolve((m as { port: number }).port));
    child.once("exit", (code) => reject(new Error(`The app exited before listening (exit ${code}).`)));
  });
  return { child, url: `http://127.0.0.1:${port}`, errors };
}

/** Signs in as the officer the way the client does; returns the session cookie. */
async function signIn(url: string, email: string): Promise<string> {
  const first = await fetch(`${url}/api/auth/csrf`);
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const cookieOf = (res: Response) =>
    res.headers
      .getSetCookie()
      .map((c) => c.split(";")[0]!)
      .find((c) => c.startsWith("dewline.sid="));
  const res = await fetch(`${url}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": csrfToken, cookie: cookieOf(first) ?? "" },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  const cookie = cookieOf(res);
  if (res.status !== 200 || !cookie) throw new Error(`Sign-in failed: ${res.status} ${await res.text()}`);
  return cookie;
}

// ---------------------------------------------------------------------------------------------
// 3. Load through the API (autocannon) and the same queries through mysql2

interface AutocannonResult {
  duration: number;
  errors: number;
  timeouts: number;
  non2xx: number;
  requests: { average: number; total: number };
}
interface AutocannonInstance {
  on(event: "response", listener: (client: unknown, statusCode: number, bytes: number, responseTime: number) => void): void;
}
type Autocannon = (
  options: Record<string, unknown>,
  done: (error: Error | null, result: AutocannonResult) => void,
) => AutocannonInstance;
// autocannon ships no type declarations; this is the part of its API used here.
const autocannon = createRequire(import.meta.url)("autocannon") as Autocannon;

async function loadApi(
  url: string,
  cookie: string,
  seconds: number,
): Promise<{ all: number[]; per: number[][]; result: AutocannonResult; firstFailure: string | null }> {
  const per: number[][] = SCENARIOS.map(() => []);
  const all: number[] = [];
  let last = -1;
  let firstFailure: string | null = null;
  const result = await new Promise<AutocannonResult>((resolve, reject) => {
    const instance = autocannon(
      {
        url,
        connections: CONNECTIONS,
        duration: seconds,
        headers: { cookie },
        // Each connection goes through the four requests in turn. onResponse runs just before the
        // 'response' event for the same response, which says which scenario the latency belongs to.
        requests: SCENARIOS.map((s, i) => ({
          method: "GET",
          path: `/api/cases?${s.query}`,
          onResponse: (status: number, body: string) => {
            last = i;
            if (status !== 200 && firstFailure === null) firstFailure = `${s.name}: ${status} ${String(body).slice(0, 300)}`;
          },
        })),
      },
      (error, r) => (error ? reject(error) : resolve(r)),
    );
    instance.on("response", (_client, statusCode, _bytes, responseTime) => {
      if (statusCode !== 200 || last < 0) return;
      per[last]!.push(responseTime);
      all.push(responseTime);
      last = -1;
    });
  });
  return { all, per, result, firstFailure };
}

interface CapturedQuery {
  sql: string;
  params: unknown[];
}

/** Captures every query TypeORM sends while `capturing` is set. */
class CaptureLogger implements TypeOrmLogger {
  capturing = false;
  queries: CapturedQuery[] = [];
  logQuery(query: string, parameters?: unknown[]) {
    if (this.capturing) this.queries.push({ sql: query, params: parameters ?? [] });
  }
  logQueryError() {}
  logQuerySlow() {}
  logSchemaBuild() {}
  logMigration() {}
  log() {}
}

/**
 * What QueueService.list asks MariaDB for one scenario: a search's homes first (if any), then the page
 * (with the stored total for a status-only view) and, for other views, their COUNT(*) beside it.
 */
interface ScenarioSql {
  homes?: CapturedQuery;
  list: CapturedQuery;
  count?: CapturedQuery;
}

/** Runs a scenario's SQL as QueueService does: the homes, then the page's SELECT beside its total. */
async function runScenarioSql(pool: mysql.Pool, q: ScenarioSql): Promise<void> {
  if (q.homes) await pool.query(q.homes.sql, q.homes.params);
  await Promise.all([pool.query(q.list.sql, q.list.params), q.count && pool.query(q.count.sql, q.count.params)]);
}

/** The SQL QueueService.list issues for each scenario, as TypeORM writes it. */
async function captureQueueSql(ds: DataSource, capture: CaptureLogger, actor: Actor): Promise<ScenarioSql[]> {
  const config = loadConfig({ ...process.env, NODE_ENV: "test" });
  const queue = createServices(config, ds, createMailer(config), createLogger("silent")).queue;
  const out: ScenarioSql[] = [];
  for (const s of SCENARIOS) {
    capture.queries = [];
    capture.capturing = true;
    await queue.list(actor, queueQuerySchema.parse(Object.fromEntries(new URLSearchParams(s.query))));
    capture.capturing = false;
    const list = capture.queries.find(
      (q) => /^SELECT/.test(q.sql) && /\bLIMIT\b/.test(q.sql) && q.sql.includes("AS addressLine1"),
    );
    // The total, when it is not asked for in the page query (the stored counts' sum for a status-only view is).
    const count = capture.queries.find((q) => /^SELECT COUNT\(\*\)/.test(q.sql));
    const homes = capture.queries.find((q) => /^SELECT (DISTINCT )?p\.id AS id FROM /.test(q.sql));
    if (!list || !(count || list.sql.includes("FROM case_status_counts")))
      throw new Error(`Could not find the queue queries for ${s.name} among:\n${capture.queries.map((q) => q.sql).join("\n")}`);
    out.push({ ...(homes ? { homes } : {}), list, ...(count ? { count } : {}) });
  }
  return out;
}

/** 20 loops over a pool the size of the app's (poolSize 10), each running its scenario's SQL as QueueService does. */
async function loadRaw(pool: mysql.Pool, queries: ScenarioSql[], seconds: number): Promise<{ all: number[]; per: number[][] }> {
  const per: number[][] = SCENARIOS.map(() => []);
  const all: number[] = [];
  const end = performance.now() + seconds * 1000;
  await Promise.all(
    Array.from({ length: CONNECTIONS }, async () => {
      for (let i = 0; performance.now() < end; i = (i + 1) % queries.length) {
        const start = performance.now();
        await runScenarioSql(pool, queries[i]!);
        const ms = performance.now() - start;
        per[i]!.push(ms);
        all.push(ms);
      }
    }),
  );
  return { all, per };
}

const SINGLE_RUNS = 100;

/** Each scenario once in turn, SINGLE_RUNS times, through the API and as raw SQL: latency without queueing. */
async function oneAtATime(
  url: string,
  cookie: string,
  pool: mysql.Pool,
  queries: ScenarioSql[],
): Promise<{ api: number[][]; raw: number[][] }> {
  const api: number[][] = SCENARIOS.map(() => []);
  const raw: number[][] = SCENARIOS.map(() => []);
  for (let n = 0; n < SINGLE_RUNS; n++) {
    for (const [i, s] of SCENARIOS.entries()) {
      let start = performance.now();
      const res = await fetch(`${url}/api/cases?${s.query}`, { headers: { cookie } });
      await res.arrayBuffer();
      if (res.status !== 200) throw new Error(`${s.name} answered ${res.status}.`);
      api[i]!.push(performance.now() - start);
      start = performance.now();
      await runScenarioSql(pool, queries[i]!);
      raw[i]!.push(performance.now() - start);
    }
  }
  return { api, raw };
}

/** One path under autocannon, 20 connections for `seconds`: the requests answered 200, and every response's latency. */
async function loadPath(
  url: string,
  cookie: string,
  path: string,
  seconds: number,
): Promise<{ ok: number; failed: number; latencies: number[] }> {
  const latencies: number[] = [];
  let ok = 0;
  const result = await new Promise<AutocannonResult>((resolve, reject) => {
    const instance = autocannon(
      { url: `${url}${path}`, connections: CONNECTIONS, duration: seconds, headers: { cookie } },
      (error, r) => (error ? reject(error) : resolve(r)),
    );
    instance.on("response", (_client, statusCode, _bytes, responseTime) => {
      if (statusCode !== 200) return;
      ok++;
      latencies.push(responseTime);
    });
  });
  return { ok, failed: result.errors + result.timeouts + result.non2xx, latencies };
}

/**
 * GET /api/auth/me and the queue's default page, each with 20 connections, in alternating rounds of the
 * same length (me, queue, me, queue, …), so both see the same machine: the ratio of their throughputs
 * holds even when other work on the machine changes the absolute figures.
 */
async function sideBySide(url: string, cookie: string, queuePath: string, pids: { app: number; mariadb: number }) {
  const round = DURATION_S / SIDE_BY_SIDE_ROUNDS;
  const newSide = () => ({ ok: 0, failed: 0, latencies: [] as number[], perRound: [] as number[], appCpuMs: 0, dbCpuMs: 0 });
  const me = newSide();
  const queue = newSide();
  for (let i = 0; i < SIDE_BY_SIDE_ROUNDS; i++) {
    for (const [side, path] of [
      [me, "/api/auth/me"],
      [queue, queuePath],
    ] as const) {
      const before = { app: cpuMs(pids.app), db: cpuMs(pids.mariadb) };
      const r = await loadPath(url, cookie, path, round);
      side.appCpuMs += cpuMs(pids.app) - before.app;
      side.dbCpuMs += cpuMs(pids.mariadb) - before.db;
      side.ok += r.ok;
      side.failed += r.failed;
      side.latencies.push(...r.latencies);
      side.perRound.push(r.ok / round);
    }
  }
  return { me, queue, seconds: DURATION_S, ratio: queue.ok / me.ok };
}

/** CPU time a process has used so far (user + system, from /proc), in ms; NaN when it cannot be read. */
function cpuMs(pid: number): number {
  try {
    // Fields after the command name (which may hold spaces): utime and stime are the 12th and 13th.
    const fields = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1]!.split(" ");
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / CLOCK_TICKS;
  } catch {
    return Number.NaN;
  }
}
/** Clock ticks per second of /proc's CPU times (USER_HZ, 100 on Linux). */
const CLOCK_TICKS = 100;

async function explain(pool: mysql.Pool, q: CapturedQuery): Promise<string[]> {
  const [rows] = await pool.query(`EXPLAIN ${q.sql}`, q.params);
  return (rows as Record<string, unknown>[]).map(
    (r) =>
      `${String(r.select_type).padEnd(18)} ${String(r.table).padEnd(6)} ${String(r.type).padEnd(7)} key=${String(r.key ?? "-")} rows≈${fmt(Number(r.rows ?? 0))} ${r.filtered !== undefined ? `filtered=${r.filtered}% ` : ""}${String(r.Extra ?? "")}`,
  );
}

// ---------------------------------------------------------------------------------------------
// 4. First page in headless Chromium

/** Newest modification time under the client's sources, to tell whether dist/ is stale. */
function newestSource(): number {
  let newest = 0;
  const walk = (p: string) => {
    const s = statSync(p);
    if (s.isDirectory()) for (const e of readdirSync(p)) walk(path.join(p, e));
    else newest = Math.max(newest, s.mtimeMs);
  };
  for (const p of ["src", "index.html", "vite.config.ts", "package.json", "public"])
    if (existsSync(path.join(projectRoot, p))) walk(path.join(projectRoot, p));
  return newest;
}

async function ensureClientBuilt(): Promise<string> {
  const index = path.join(projectRoot, "dist", "index.html");
  if (existsSync(index) && statSync(index).mtimeMs >= newestSource()) return "dist/ is up to date";
  const start = performance.now();
  await runStep("npx", ["vite", "build", "--logLevel", "error"], { cwd: projectRoot });
  return `built the client with vite in ${((performance.now() - start) / 1000).toFixed(1)} s`;
}

interface RenderTiming {
  /** Navigation start → first case row visible, on the page's own clock. */
  ms: number;
  domContentLoaded: number;
  /** The page's API calls: path, start and end, ms since navigation start. */
  api: { path: string; start: number; end: number }[];
}

/**
 * Runs in the page before its own scripts: notes the page's clock (ms since navigation start) at
 * the first animation frame after a case row's reference link (a link in a table, text DW-…) is
 * laid out, so the figure does not depend on how often Playwright polls. Playwright's role-based
 * locator then confirms that a row is really visible.
 */
const FIRST_ROW_WATCH = `(() => {
  const found = () => [...document.querySelectorAll("table a")].some((a) => /^DW-/.test((a.textContent || "").trim()) && a.getBoundingClientRect().height > 0);
  const observer = new MutationObserver(() => {
    if (!found()) return;
    observer.disconnect();
    requestAnimationFrame(() => { window.__firstRowAt = performance.now(); });
  });
  observer.observe(document, { childList: true, subtree: true, characterData: true });
})();`;

async function renderTimes(url: string, cookie: string): Promise<{ cold: RenderTiming[]; warm: RenderTiming[] }> {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
  const [name, ...rest] = cookie.split("=");
  const session = { name: name!, value: rest.join("="), url };
  try {
    const load = async (context: Awaited<ReturnType<typeof browser.newContext>>): Promise<RenderTiming> => {
      const page = await context.newPage();
      try {
        await page.goto(`${url}/queue`, { waitUntil: "commit" });
        await page.getByRole("table").getByRole("link", { name: /^DW-/ }).first().waitFor({ state: "visible", timeout: 30_000 });
        return await page.evaluate(() => {
          const ms = (globalThis as { __firstRowAt?: number }).__firstRowAt ?? Number.NaN;
          const entries = performance.getEntries();
          const nav = entries.find((e) => (e.entryType as string) === "navigation") as unknown as
            { domContentLoadedEventEnd: number } | undefined;
          const api = entries
            .filter((e) => (e.entryType as string) === "resource" && e.name.includes("/api/"))
            .map((e) => ({
              path: new URL(e.name).pathname + new URL(e.name).search,
              start: e.startTime,
              end: e.startTime + e.duration,
            }));
          return { ms, domContentLoaded: nav?.domContentLoadedEventEnd ?? Number.NaN, api };
        });
      } finally {
        await page.close();
      }
    };
    const newContext = async () => {
      const context = await browser.newContext();
      await context.addCookies([session]);
      await context.addInitScript(FIRST_ROW_WATCH);
      return context;
    };
    const cold: RenderTiming[] = [];
    for (let i = 0; i < RENDER_LOADS; i++) {
      const context = await newContext();
      cold.push(await load(context));
      await context.close();
    }
    const context = await newContext();
    await load(context); // fills the cache
    const warm: RenderTiming[] = [];
    for (let i = 0; i < RENDER_LOADS; i++) warm.push(await load(context));
    await context.close();
    return { cold, warm };
  } finally {
    await browser.close();
  }
}

// ---------------------------------------------------------------------------------------------

/** CPU count and the 1-minute load average, to read the figures by. */
const machine = () => `${cpus().length} CPUs, load average ${loadavg()[0]!.toFixed(1)}`;

async function main(): Promise<void> {
  const dir = mkdtempSync(path.join(tmpdir(), "dewline-bench-queue-"));
  const instance = { dir: path.join(dir, "mariadb"), port: await freePort() };
  const db = { host: "127.0.0.1", port: instance.port, name: "dewline_bench", user: "dewline_bench", password: "bench-only" };
  const capture = new CaptureLogger();
  let ds: DataSource | undefined;
  let app: Awaited<ReturnType<typeof startApp>> | undefined;
  let pool: mysql.Pool | undefined;
  let failed = false;
  let cleaned: Promise<void> | undefined;
  const cleanUp = () =>
    (cleaned ??= (async () => {
      await pool?.end().catch(() => undefined);
      if (app) await stopChild(app.child, 10_000).catch(() => undefined);
      if (ds?.isInitialized) await ds.destroy().catch(() => undefined);
      if (KEEP) {
        console.log(
          `--keep: MariaDB left running with the data, for EXPLAIN by hand: mariadb --no-defaults --socket=${path.join(instance.dir, "mariadbd.sock")} -uroot ${db.name}` +
            `\n  stop and remove it with: mariadb-admin --no-defaults --socket=${path.join(instance.dir, "mariadbd.sock")} -uroot shutdown && rm -rf ${dir}`,
        );
        return;
      }
      await stopMariaDb(instance.dir).catch(() => undefined);
      rmSync(dir, { recursive: true, force: true });
    })());
  // Ctrl-C stops what this run started, too.
  for (const signal of ["SIGINT", "SIGTERM"] as const)
    process.once(signal, () => void cleanUp().finally(() => process.exit(130)));
  try {
    await startMariaDb(instance);
    await ensureAppDatabase(instance, db);
    ds = new DataSource({ ...createDataSource(db).options, logger: capture });
    await ds.initialize();
    await ds.runMigrations({ transaction: "each" });

    console.log(
      `Queue benchmark — ${fmt(CASES)} cases, ${fmt(READINGS)} readings, ${fmt(HOMES)} homes; ${CONNECTIONS} connections for ${DURATION_S} s; ${machine()}`,
    );
    const seedStart = performance.now();
    const seeded = await seed(ds, db, dir, new Date());
    const seedMs = performance.now() - seedStart;
    const c = seeded.counts;
    console.log(
      `  seeded in ${(seedMs / 1000).toFixed(1)} s (generating the rows and working out the figures ${(seeded.generateMs / 1000).toFixed(1)} s; LOAD DATA ${seeded.loadTimes.join(", ")}): ` +
        `${fmt(c.homes)} homes, ${fmt(c.rooms)} rooms, ${fmt(c.cases)} cases (${fmt(c.open)} open), ${fmt(c.readings)} readings, ${fmt(c.inspections)} inspections, ${fmt(c.summaries)} written summaries, ${fmt(c.assessments)} HHSRS assessments`,
    );
    const verified = await verifyFigures(ds, seeded);
    console.log(
      `  figures verified on ${verified.checked} cases (of ${verified.checked + verified.moved} sampled, ${verified.open} of them open; ${verified.moved} skipped because a deadline step passed since seeding): ` +
        "TriageService.refresh stored the same risk state, mould index, HHSRS band and category, recurrence, priority, next deadline and triage_due_at",
    );

    const queries = await captureQueueSql(ds, capture, seeded.officer);
    const client = await ensureClientBuilt();
    app = await startApp(db);
    const cookie = await signIn(app.url, seeded.officer.email);
    for (const s of SCENARIOS) {
      const res = await fetch(`${app.url}/api/cases?${s.query}`, { headers: { cookie } });
      const body = (await res.json()) as { items: unknown[]; total: number };
      if (res.status !== 200 || body.items.length === 0)
        throw new Error(`${s.name} answered ${res.status} with ${body.items?.length ?? 0} items.`);
      console.log(
        `  ${s.name.padEnd(14)} GET /api/cases?${s.query.padEnd(42)} ${String(body.items.length).padStart(3)} items of ${fmt(body.total)}`,
      );
    }

    // A short warm-up of each side (JIT, buffer pool, connection pools), then one request at a
    // time for a baseline, then the measured runs under load.
    pool = mysql.createPool({
      host: db.host,
      port: db.port,
      user: db.user,
      password: db.password,
      database: db.name,
      timezone: "Z",
      connectionLimit: 10,
      charset: "utf8mb4_unicode_ci",
    });
    await loadApi(app.url, cookie, WARM_UP_S);
    await loadRaw(pool, queries, WARM_UP_S);
    const single = await oneAtATime(app.url, cookie, pool, queries);
    const loadBefore = machine();
    const api = await loadApi(app.url, cookie, DURATION_S);
    const raw = await loadRaw(pool, queries, DURATION_S);
    console.log(
      `Load runs: ${loadBefore} before, ${machine()} after (everything here shares these CPUs: app, MariaDB, autocannon and anything else running)`,
    );

    const r = api.result;
    console.log(
      `API: autocannon, ${CONNECTIONS} connections, ${DURATION_S} s after a ${WARM_UP_S} s warm-up, requests cycling through the four scenarios; ` +
        `${fmt(r.requests.total)} requests, ${fmt(r.requests.average)} requests/s, ${r.errors} errors, ${r.timeouts} timeouts, ${r.non2xx} non-2xx`,
    );
    console.log(
      `Raw SQL: the queries QueueService issues (captured from TypeORM), run as it runs them, ${CONNECTIONS} loops over a mysql2 pool of 10 (the app's poolSize), ${DURATION_S} s after a ${WARM_UP_S} s warm-up`,
    );
    console.log(
      `  ${"".padEnd(14)} ${"API p50".padStart(8)} ${"p95".padStart(7)} ${"p99".padStart(7)} ${"req/s".padStart(7)}   ${"raw p50".padStart(8)} ${"p95".padStart(7)} ${"p99".padStart(7)} ${"q/s".padStart(7)}   target: API p95 < 50 ms and ≤ 2 × raw p95 + 5 ms`,
    );
    const row = (name: string, a: Latencies, b: Latencies) => {
      const limit = Math.min(50, 2 * b.p95 + 5);
      const pass = a.p95 < 50 && a.p95 <= 2 * b.p95 + 5;
      if (!pass) failed = true;
      console.log(
        `  ${name.padEnd(14)} ${ms1(a.p50).padStart(8)} ${ms1(a.p95).padStart(7)} ${ms1(a.p99).padStart(7)} ${fmt(a.perSecond).padStart(7)}   ${ms1(b.p50).padStart(8)} ${ms1(b.p95).padStart(7)} ${ms1(b.p99).padStart(7)} ${fmt(b.perSecond).padStart(7)}   ` +
          `API p95 ${ms1(a.p95)} ms vs limit ${ms1(limit)} ms ${pass ? "PASS" : "FAIL"}`,
      );
    };
    row("mix", summarise(api.all, DURATION_S), summarise(raw.all, DURATION_S));
    SCENARIOS.forEach((s, i) => row(s.name, summarise(api.per[i]!, DURATION_S), summarise(raw.per[i]!, DURATION_S)));
    if (r.errors || r.timeouts || r.non2xx) {
      failed = true;
      console.log(`  FAIL: not every request succeeded; the first failure: ${api.firstFailure ?? "(none recorded)"}`);
    }
    if (app.errors.length) console.log(`  the app logged errors; the first ones:\n    ${app.errors.join("\n    ")}`);

    console.log(
      `One request at a time (${SINGLE_RUNS} of each in turn, after the warm-up), API against the same SQL through mysql2 (target: API p95 ≤ ${SINGLE_P95_TARGET_MS} ms):`,
    );
    console.log(
      `  ${"".padEnd(14)} ${"API p50".padStart(8)} ${"p95".padStart(7)}   ${"raw p50".padStart(8)} ${"p95".padStart(7)}`,
    );
    SCENARIOS.forEach((s, i) => {
      const a = summarise(single.api[i]!, 1);
      const b = summarise(single.raw[i]!, 1);
      const pass = a.p95 <= SINGLE_P95_TARGET_MS;
      if (!pass) failed = true;
      console.log(
        `  ${s.name.padEnd(14)} ${ms1(a.p50).padStart(8)} ${ms1(a.p95).padStart(7)}   ${ms1(b.p50).padStart(8)} ${ms1(b.p95).padStart(7)}   ${pass ? "PASS" : "FAIL"}`,
      );
    });

    const sideLoad = machine();
    const side = await sideBySide(app.url, cookie, `/api/cases?${SCENARIOS[0]!.query}`, {
      app: app.child.pid!,
      mariadb: Number(readFileSync(path.join(instance.dir, "mariadbd.pid"), "utf8").trim()),
    });
    const ratioPass = side.ratio >= THROUGHPUT_RATIO_TARGET && side.me.failed === 0 && side.queue.failed === 0;
    if (!ratioPass) failed = true;
    const sideRow = (name: string, x: typeof side.me) => {
      const l = summarise(x.latencies, side.seconds);
      console.log(
        `  ${name.padEnd(32)} ${fmt(x.ok / side.seconds).padStart(6)} requests/s (rounds: ${x.perRound.map(fmt).join(", ")}), p50 ${ms1(l.p50)} ms, p95 ${ms1(l.p95)} ms, ${x.failed} failed; ` +
          `CPU per request: app ${(x.appCpuMs / x.ok).toFixed(2)} ms, MariaDB ${(x.dbCpuMs / x.ok).toFixed(2)} ms`,
      );
    };
    console.log(
      `Side by side: ${CONNECTIONS} connections each, ${SIDE_BY_SIDE_ROUNDS} alternating rounds of ${ms1(DURATION_S / SIDE_BY_SIDE_ROUNDS)} s per route (${sideLoad} before, ${machine()} after):`,
    );
    sideRow("GET /api/auth/me", side.me);
    sideRow(`GET /api/cases?${SCENARIOS[0]!.query}`, side.queue);
    console.log(
      `  queue's default page at ${side.ratio.toFixed(2)} × /api/auth/me's throughput   (target ≥ ${THROUGHPUT_RATIO_TARGET}) ${ratioPass ? "PASS" : "FAIL"}`,
    );

    console.log("EXPLAIN of each scenario's queries:");
    for (const [i, s] of SCENARIOS.entries()) {
      const homes = queries[i]!.homes;
      if (homes) {
        console.log(`  ${s.name} — the matching homes:`);
        for (const l of await explain(pool, homes)) console.log(`    ${l}`);
      }
      console.log(`  ${s.name} — list:`);
      for (const l of await explain(pool, queries[i]!.list)) console.log(`    ${l}`);
      console.log(`  ${s.name} — count:`);
      const count = queries[i]!.count;
      if (count) for (const l of await explain(pool, count)) console.log(`    ${l}`);
      else console.log("    (in the list's query: the stored counts)");
    }

    const render = await renderTimes(app.url, cookie);
    console.log(
      `Queue page in headless Chromium (/queue, navigation start → first case row visible), ${RENDER_LOADS} loads each (${client}):`,
    );
    const describe = (label: string, loads: RenderTiming[]) => {
      const sorted = [...loads].sort((a, b) => a.ms - b.ms);
      const mid = sorted[sorted.length >> 1]!;
      const calls = mid.api.map((a) => `${a.path.replace(/\?.*/, "")} ${a.start.toFixed(0)}–${a.end.toFixed(0)}`).join(", ");
      console.log(
        `  ${label} median ${mid.ms.toFixed(0)} ms (${loads.map((l) => l.ms.toFixed(0)).join(", ")}); that load: DOMContentLoaded at ${mid.domContentLoaded.toFixed(0)} ms, API calls (ms) ${calls}`,
      );
      return mid.ms;
    };
    const cold = describe("empty cache:", render.cold);
    describe("warm cache: ", render.warm);
    // Together: /api/cases was asked for before the session check (/api/auth/me) had answered, on every load.
    const together = (l: RenderTiming) => {
      const me = l.api.find((a) => a.path.startsWith("/api/auth/me"));
      const cases = l.api.find((a) => /^\/api\/cases(\?|$)/.test(a.path));
      return me !== undefined && cases !== undefined && cases.start < me.end;
    };
    const overlapping = [...render.cold, ...render.warm].filter(together).length;
    const renderPass = cold < 1000 && overlapping === render.cold.length + render.warm.length;
    if (!renderPass) failed = true;
    console.log(
      `  first rows with an empty cache in ${cold.toFixed(0)} ms, /api/auth/me and /api/cases fetched together on ${overlapping} of ${render.cold.length + render.warm.length} loads   (target < 1000 ms, together on every load) ${renderPass ? "PASS" : "FAIL"}`,
    );
  } catch (error) {
    failed = true;
    throw error;
  } finally {
    if (failed) process.exitCode = 1;
    await cleanUp();
  }
}

// Run, unless imported for its seeding (bench:insight).
const runDirectly = process.argv[1] !== undefined && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (runDirectly && argv.includes(SERVE_FLAG)) await serveApp();
else if (runDirectly) await main();
