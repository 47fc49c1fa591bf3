// The case evidence pack, read back as a person (or an ombudsman) would: pdfinfo for its pages,
// pdftotext for what it says, pdfimages for its photos and pdfdetach for the attached facts. The hash
// is recomputed here from the definition (SHA-256 of the attached facts.json, whose photo entries are
// the SHA-256 of each embedded image), not from the server's code.
import { execFile } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtemp, readdir, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import type { Response } from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { localDate } from "../../src/lib/domain/working-days.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { jpegWithGps } from "../support/images.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, testClock, workingDaysAhead } from "../support/test-clock.js";

const run = promisify(execFile);

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let lead: Client;
let tenant: Client;
let caseId: number;
let reference: string;
let dir: string;
const PHOTOS = 3;
const LONG_NOTE = `Internal: ${"the wardrobe stands against the coldest wall of the bedroom and ".repeat(12)}end of note.`;

const binary = (res: Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on("data", (c: Buffer) => chunks.push(c));
  res.on("end", () => cb(null, Buffer.concat(chunks)));
};

const download = (client: Client, id = caseId) => client.agent.get(`/api/cases/${id}/evidence-pack`).buffer(true).parse(binary);

const text = async (file: string, page?: number) =>
  (
    await run("pdftotext", ["-layout", ...(page ? ["-f", String(page), "-l", String(page)] : []), file, "-"], {
      maxBuffer: 64 << 20,
    })
  ).stdout;

const sha256 = (b: Buffer | string) => createHash("sha256").update(b).digest("hex");

beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), "dewline-pack-"));
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);

  const home = (await tenant.get("/api/me/home").expect(200)).body.property;
  const roomId: number = home.rooms[0].id;
  const created = await tenant
    .post("/api/cases", {
      description: "Black mould on the bedroom wall behind the wardrobe; the baby's cot is in this room.",
      locations: ["external-wall"],
      observations: ["mould-spots"],
      roomIds: [roomId],
    })
    .expect(201);
  caseId = created.body.id;
  reference = created.body.reference;
  for (let i = 0; i < PHOTOS; i++) {
    await tenant.agent
      .post(`/api/cases/${caseId}/photos`)
      .set("X-CSRF-Token", tenant.csrf)
      // Different shapes: each is placed whole, whatever its aspect ratio.
      .attach("photos", await jpegWithGps(i === 1 ? 600 : 1000, i === 1 ? 900 : 700, i + 11), `wall-${i}.jpg`)
      .expect(201);
  }
  await tenant
    .post(
      `/api/cases/${caseId}/readings`,
      Array.from({ length: 24 }, (_, h) => ({
        roomId,
        takenAt: hoursAgo(48 - h).toISOString(),
        airTemperatureC: 18,
        relativeHumidityPct: 70 + (h % 6),
        surfaceTemperatureC: 12,
      })),
    )
    .expect(201);

  await officer
    .patch(`/api/cases/${caseId}`, { status: "triaged", hazardClass: "significant", reason: "Baby in the room." })
    .expect(200);
  await officer
    .post(`/api/cases/${caseId}/inspections`, {
      inspectedAt: hoursAgo(2).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "Mould behind the wardrobe on the external wall.",
      roomReadings: [{ roomId, airTemperatureC: 18, relativeHumidityPct: 70, note: "Cold corner." }],
    })
    .expect(201);
  for (const likelihood of [180, 100]) {
    await officer
      .post(`/api/cases/${caseId}/assessments`, {
        likelihood,
        spread: [0, 0.2, 10, 89.8],
        justification: `Likelihood 1 in ${likelihood}: young child in the room.`,
      })
      .expect(201);
  }
  await officer.post(`/api/cases/${caseId}/messages`, { body: LONG_NOTE, internal: true }).expect(201);
  await officer
    .post(`/api/cases/${caseId}/summary`, {
      body: "We found condensation mould on the bedroom wall and will fit a fan and wash the wall.",
    })
    .expect(201);
  await tenant.post(`/api/cases/${caseId}/messages`, { body: "Thank you. Mornings suit us best." }).expect(201);
  const fan = (
    await officer
      .post(`/api/cases/${caseId}/work-orders`, { type: "extractor-fan", description: "Fit a continuous fan." })
      .expect(201)
  ).body;
  const [slotDay] = workingDaysAhead(3, 1);
  await lead
    .patch(`/api/work-orders/${fan.id}`, { assigneeId: landlord.maintenance.id, slot: { date: slotDay, window: "am" } })
    .expect(200);
  await lead
    .patch(`/api/work-orders/${fan.id}`, {
      complete: {
        note: "Fitted and tested.",
        doneOn: localDate(testClock.now()),
        earlyReason: "A cancellation freed the morning.",
      },
    })
    .expect(200);
  await t.ctx.services.mail.relay.idle();
});

afterAll(async () => {
  await t?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe("a case's evidence pack", () => {
  let file: string;
  let res: Response;
  let pages: number;

  beforeAll(async () => {
    res = await download(officer).expect(200);
    file = path.join(dir, "pack.pdf");
    await writeFile(file, res.body as Buffer);
    pages = Number(/Pages:\s+(\d+)/.exec((await run("pdfinfo", [file])).stdout)?.[1]);
  });

  it("is a PDF named after the case, every section present", async () => {
    expect(res.headers["content-type"]).toBe("application/pdf");
    // RFC 6266: a token needs no quotes.
    expect(res.headers["content-disposition"]).toBe(`attachment; filename=${reference}-evidence-pack.pdf`);
    const all = await text(file);
    for (const heading of [
      "The home",
      "The household's report",
      "Photos",
      "Readings",
      "The engine's evaluation",
      "HHSRS assessments",
      "Inspections",
      "Letters and the written summary",
      "Messages and internal notes",
      "E-mails and their delivery",
      "Deadlines",
      "Works",
      "Verification of the works",
      "Complaints",
      "Timeline",
      "About this pack",
    ]) {
      expect(all, heading).toContain(heading);
    }
    expect(all).toContain("the baby's cot is in this room");
    expect(all).toContain("No complaint has been raised about this case.");
    expect(all).toContain("BS EN ISO 13788");
    expect(all).toContain("Hukka & Viitanen");
    expect(all).toContain("Version 1");
    expect(all).toContain("Version 2");
    // Staff-only text is there, labelled; the long note wraps rather than running off the page.
    expect(all).toContain("Internal, staff only");
    expect(all.replace(/\s+/g, " ")).toContain("end of note.");
    expect(all).toContain("A cancellation freed the morning.");
    // Deadlines: the investigation was done (met); the e-mails carry their delivery.
    expect(all).toMatch(/Investigate\s.*Met/);
    expect(all).toMatch(/sent/i);
  });

  it("has the expected pages: the opening pages, one page per photo, then the rest; each numbered X of Y", async () => {
    // Page 1: the cover, the home and the report; pages 2–4: one photo each (the first under the
    // section's heading); then the readings onwards.
    const first = await text(file, 1);
    expect(first).toContain("The household's report");
    expect(await text(file, 2)).toContain("Photos");
    for (let i = 1; i <= PHOTOS; i++) {
      const page = await text(file, 1 + i);
      expect(page).toContain(`Photo ${i} of ${PHOTOS}`);
      expect(page).toContain("Added");
    }
    expect(await text(file, 2 + PHOTOS)).toContain("Readings");
    expect(pages).toBe(PAGES_EXPECTED);
    for (let p = 1; p <= pages; p++) expect(await text(file, p)).toContain(`Page ${p} of ${pages}`);
  });

  it("prints one hash on every page, the one on the timeline and the one recomputed from the attached facts and photos", async () => {
    const hashes = new Set<string>();
    for (let p = 1; p <= pages; p++) {
      const found = /Content SHA-256 ([0-9a-f]{64})/.exec(await text(file, p));
      expect(found, `page ${p}`).not.toBeNull();
      hashes.add(found![1]!);
    }
    expect(hashes.size).toBe(1);
    const [printed] = [...hashes];

    const events = (await officer.get(`/api/cases/${caseId}/events`).expect(200)).body.events;
    const made = events.filter((e: { type: string }) => e.type === "evidence-pack-made");
    expect(made).toHaveLength(1);
    expect(made[0].after).toEqual({ sha256: printed, pages, fileName: `${reference}-evidence-pack.pdf` });
    expect(made[0].actor.name).toBe(landlord.officer.name);

    // Recomputed: facts.json from the PDF, its SHA-256; each photo's bytes from the PDF, their SHA-256.
    const out = path.join(dir, "detached");
    await run("mkdir", ["-p", out]);
    await run("pdfdetach", ["-saveall", "-o", out, file]);
    const facts = await readFile(path.join(out, "facts.json"));
    expect(sha256(facts)).toBe(printed);
    const parsed = JSON.parse(facts.toString("utf8"));
    // Canonical: keys sorted at every level, no spaces (re-written here independently).
    const canonical = (v: unknown): string =>
      Array.isArray(v)
        ? `[${v.map(canonical).join(",")}]`
        : v && typeof v === "object"
          ? `{${Object.keys(v)
              .sort()
              .map((k) => `${JSON.stringify(k)}:${canonical((v as Record<string, unknown>)[k])}`)
              .join(",")}}`
          : JSON.stringify(v);
    expect(canonical(parsed)).toBe(facts.toString("utf8"));
    expect(parsed.case.reference).toBe(reference);
    expect(parsed.readings.count).toBe(24);

    const images = path.join(dir, "images");
    await run("mkdir", ["-p", images]);
    const list = (await run("pdfimages", ["-list", file])).stdout.trim().split("\n").slice(2);
    expect(list).toHaveLength(PHOTOS);
    await run("pdfimages", ["-all", file, path.join(images, "img")]);
    const extracted = (await readdir(images)).sort();
    expect(extracted).toHaveLength(PHOTOS);
    const photoHashes = await Promise.all(extracted.map(async (f) => sha256(await readFile(path.join(images, f)))));
    expect(photoHashes).toEqual(parsed.photos.map((p: { sha256: string }) => p.sha256));
    // And they are the photos the case holds (as served to staff).
    const held = (await officer.get(`/api/cases/${caseId}/photos`).expect(200)).body.photos;
    for (const [i, p] of held.entries()) {
      const served = await officer.agent.get(`/api/photos/${p.id}`).buffer(true).parse(binary).expect(200);
      expect(sha256(served.body as Buffer)).toBe(photoHashes[i]);
    }
  });

  it("is not on the tenant's timeline", async () => {
    const events = (await tenant.get(`/api/cases/${caseId}/events`).expect(200)).body.events;
    expect(events.map((e: { type: string }) => e.type)).not.toContain("evidence-pack-made");
  });
});

describe("who may have it", () => {
  it("gives it to the case's officers, leads and admins; not to the tenant; another landlord gets 404", async () => {
    const admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
    await download(admin).expect(200);
    await download(lead).expect(200);
    const refused = await tenant.get(`/api/cases/${caseId}/evidence-pack`).expect(403);
    expect(refused.headers["content-type"]).toMatch(/json/);
    const other = await makeLandlord(t.ctx.dataSource);
    const otherOfficer = await signedInClient(t.app, other.officer.email, PASSWORD);
    await otherOfficer.get(`/api/cases/${caseId}/evidence-pack`).expect(404);
    await officer.get(`/api/cases/99999999/evidence-pack`).expect(404);
    // Each pack made is on the timeline; the refusals are not.
    const events = (await officer.get(`/api/cases/${caseId}/events`).expect(200)).body.events;
    expect(events.filter((e: { type: string }) => e.type === "evidence-pack-made")).toHaveLength(3);
  });
});

/**
 * 1 (cover, home, report) + 3 (a photo each) + 4 from the readings chart to "About this pack" (this
 * case's evaluation, two assessment versions, the long internal note, six e-mails, the works and a
 * timeline of some thirty entries). Counted from this case's layout: a change that moves it shows here.
 */
const PAGES_EXPECTED = 1 + PHOTOS + 4;
