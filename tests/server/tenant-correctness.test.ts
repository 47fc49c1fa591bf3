// What a tenant notices going wrong, checked through the real API: the photo preview's security
// policy, photos taken or refused file by file, readings from the future, surface humidity over
// 100 % in the officers' alert, and the tenant's letters (one greeting, the landlord's emergency
// number, no band letters, no zone names, never the officer's own notes).
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildSummaryTemplate, hasPlaceholder } from "@/features/case-workspace/lib/summary-template";
import { Photo } from "../../server/modules/photos/photo.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { jpegWithGps } from "../support/images.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, msAgo } from "../support/test-clock.js";

const uploads = mkdtempSync(path.join(tmpdir(), "dewline-tenant-correctness-"));
let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let officer: Client;
let admin: Client;
let bedroomId: number;

const report = {
  description: "Black mould on the bedroom wall behind the bed.",
  locations: ["external-wall"],
  observations: ["mould-spots"],
};

beforeAll(async () => {
  t = await createTestApp({ UPLOADS_DIR: uploads });
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
  bedroomId = (await tenant.get("/api/me/home")).body.property.rooms.find((r: { kind: string }) => r.kind === "bedroom").id;
});
afterAll(async () => {
  await t.close();
  rmSync(uploads, { recursive: true, force: true });
});

const put = (client: Client, url: string, body: object) => client.agent.put(url).set("X-CSRF-Token", client.csrf).send(body);

describe("the security policy", () => {
  it("lets the photo preview show blob: images and loosens nothing else", async () => {
    const res = await request(t.app).get("/api/health/live").expect(200);
    // helmet 8's default directives (helmet's README), with blob: added to img-src only.
    expect(res.headers["content-security-policy"]).toBe(
      [
        "default-src 'self'",
        "base-uri 'self'",
        "font-src 'self' https: data:",
        "form-action 'self'",
        "frame-ancestors 'self'",
        "img-src 'self' data: blob:",
        "object-src 'none'",
        "script-src 'self'",
        "script-src-attr 'none'",
        "style-src 'self' https: 'unsafe-inline'",
        "upgrade-insecure-requests",
      ].join(";"),
    );
  });
});

describe("a batch of photos", () => {
  const upload = (client: Client, id: number, files: [Buffer, string][]) => {
    const req = client.agent.post(`/api/cases/${id}/photos`).set("X-CSRF-Token", client.csrf);
    for (const [buf, name] of files) req.attach("photos", buf, name);
    return req;
  };

  it("keeps the good photo and refuses the unreadable file by name, with its reason", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const res = await upload(tenant, c.id, [
      [await jpegWithGps(400, 300, 11), "wall.jpg"],
      [Buffer.from("this is not a picture at all"), "garbage.jpg"],
    ]).expect(201);
    expect(res.body.photos).toHaveLength(1);
    expect(res.body.refused).toEqual([
      { name: "garbage.jpg", reason: "This file is not a photo we can read. Please send JPEG, PNG, WebP or AVIF images." },
    ]);
    const stored = await t.ctx.dataSource.getRepository(Photo).findBy({ caseId: c.id });
    expect(stored.map((p) => p.id)).toEqual([res.body.photos[0].id]);
    // The good one is there to see.
    await tenant.get(res.body.photos[0].thumbnailUrl).expect(200).expect("Content-Type", "image/jpeg");
  });

  it("answers 415 with every file's reason when none can be taken, and stores nothing", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const res = await upload(tenant, c.id, [
      [Buffer.from("not an image"), "one.jpg"],
      [Buffer.from("nor this"), "two.png"],
    ]).expect(415);
    expect(res.body.error.details.refused.map((r: { name: string }) => r.name)).toEqual(["one.jpg", "two.png"]);
    expect(res.body.error.message).toMatch(/None of the 2 files could be added/);
    expect(await t.ctx.dataSource.getRepository(Photo).countBy({ caseId: c.id })).toBe(0);
  });
});

describe("readings from the future", () => {
  it("refuses a reading taken later than now (beyond a few minutes' clock drift), naming takenAt, and stores nothing", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    const future = msAgo(-20 * 60_000).toISOString();
    const res = await tenant
      .post(`/api/cases/${c.id}/readings`, [
        { roomId: bedroomId, takenAt: hoursAgo(1).toISOString(), airTemperatureC: 19, relativeHumidityPct: 70 },
        { roomId: bedroomId, takenAt: future, airTemperatureC: 19, relativeHumidityPct: 70 },
      ])
      .expect(400);
    expect(res.body.error.details).toEqual([{ field: "1.takenAt", message: expect.stringMatching(/takenAt.*in the future/) }]);
    expect((await tenant.get(`/api/cases/${c.id}/readings`).expect(200)).body.readings).toEqual([]);

    // A phone clock a minute fast is fine.
    await tenant
      .post(`/api/cases/${c.id}/readings`, [
        { roomId: bedroomId, takenAt: msAgo(-60_000).toISOString(), airTemperatureC: 19, relativeHumidityPct: 70 },
      ])
      .expect(201);
  });

  it("tells officers a surface below the dew point is condensing, never a humidity over 100 %", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    // 19 °C at 78 % on a 9 °C surface: about 149 % as a raw ratio (see tests/domain/surface-humidity-words.test.ts).
    await tenant
      .post(`/api/cases/${c.id}/readings`, [
        {
          roomId: bedroomId,
          takenAt: hoursAgo(2).toISOString(),
          airTemperatureC: 19,
          relativeHumidityPct: 78,
          surfaceTemperatureC: 9,
        },
      ])
      .expect(201);
    await expect
      .poll(() => t.mail.mails.some((m) => m.subject.includes(c.reference) && m.to.includes(landlord.officer.email)))
      .toBe(true);
    const alert = t.mail.mails.find((m) => m.subject.includes(c.reference) && m.to.includes(landlord.officer.email))!;
    expect(alert.text).toContain("condensing (the surface is below the dew point)");
    expect(alert.text).not.toMatch(/\b(1\d\d|[2-9]\d\d) %/);
  });
});

describe("the tenant's letters", () => {
  it("acknowledges and summarises with one greeting, the landlord's emergency number, and no band, zone or officer's notes", async () => {
    await put(admin, "/api/policy", {
      emergencyMakeSafeHours: 24,
      investigateWorkingDays: 10,
      summaryWorkingDays: 3,
      safetyWorkWorkingDays: 5,
      supplementaryWorkWeeks: 12,
      emergencyPhone: "0800 555 0199",
    }).expect(200);
    const bad = await put(admin, "/api/policy", {
      emergencyMakeSafeHours: 24,
      investigateWorkingDays: 10,
      summaryWorkingDays: 3,
      safetyWorkWorkingDays: 5,
      supplementaryWorkWeeks: 12,
      emergencyPhone: "ring the office",
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].field).toBe("emergencyPhone");
    expect((await officer.get("/api/policy").expect(200)).body.emergencyPhone).toBe("0800 555 0199");

    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    await expect.poll(() => t.mail.mails.some((m) => m.subject === `We have your report ${c.reference}`)).toBe(true);
    const ack = t.mail.mails.find((m) => m.subject === `We have your report ${c.reference}`)!.text;
    expect(ack).toContain("emergency line straight away on 0800 555 0199.");

    const marker = "<b>RAW-NOTE-7731</b> ext wall N/E cold; tenant v. upset";
    await officer
      .post(`/api/cases/${c.id}/inspections`, {
        inspectedAt: hoursAgo(3).toISOString(),
        cause: "condensation",
        mouldExtent: "1-to-5-m2",
        findings: marker,
        roomReadings: [{ roomId: bedroomId, airTemperatureC: 17, relativeHumidityPct: 72, surfaceTemperaturesC: [11.5] }],
      })
      .expect(201);
    // (1000·0 + 1000·0.1 + 300·4.6 + 10·95.3)/10 = 243.3: band E, Category 2 (HHSRS Operating Guidance formula and bands, TRADE.md §4).
    await officer
      .post(`/api/cases/${c.id}/assessments`, {
        likelihood: 10,
        spread: [0, 0.1, 4.6, 95.3],
        justification: "Mould in a bedroom on a cold external wall.",
      })
      .expect(201);

    // The draft the workspace offers, from the same API replies, with the officer's own parts written in.
    const [inspections, assessments, deadlines] = await Promise.all([
      officer.get(`/api/cases/${c.id}/inspections`).expect(200),
      officer.get(`/api/cases/${c.id}/assessments`).expect(200),
      officer.get(`/api/cases/${c.id}/deadlines`).expect(200),
    ]);
    const draft = buildSummaryTemplate({
      reference: c.reference,
      address: "the home",
      inspections: inspections.body.inspections,
      assessments: assessments.body.assessments,
      deadlines: deadlines.body.deadlines,
      sender: { name: "Priya Venn", role: "Housing officer" },
    });
    expect(draft).not.toContain("RAW-NOTE-7731");
    const body = draft.replace(
      /\[Fill in: [^\]]*\]/g,
      "We will fit a continuous extractor fan in the bedroom and treat the mould.",
    );
    expect(hasPlaceholder(body)).toBe(false);
    await officer.post(`/api/cases/${c.id}/summary`, { body }).expect(201);

    const subject = `What we found and what happens next: ${c.reference}`;
    await expect.poll(() => t.mail.mails.some((m) => m.subject === subject)).toBe(true);
    const text = t.mail.mails.find((m) => m.subject === subject)!.text;
    expect(text.match(/\b(Hello|Dear)\b/g)).toEqual(["Hello"]);
    expect(text).toContain(`Hello ${landlord.tenant.name},`);
    expect(text).toContain("0800 555 0199");
    expect(text).toContain("Category 2 hazard");
    expect(text).not.toMatch(/\bband\b/i);
    expect(text).not.toMatch(/\b(GMT|BST|UTC)\b/);
    expect(text).not.toContain("RAW-NOTE-7731");
    expect(text).not.toMatch(/<\/?b>/);
  });

  it("keeps one greeting when the officer writes their own", async () => {
    const c = (await tenant.post("/api/cases", report).expect(201)).body;
    await officer
      .post(`/api/cases/${c.id}/inspections`, {
        inspectedAt: hoursAgo(1).toISOString(),
        cause: "condensation",
        mouldExtent: "none",
        findings: "Condensation on the bedroom window; no mould.",
        roomReadings: [{ roomId: bedroomId, airTemperatureC: 18, relativeHumidityPct: 70 }],
      })
      .expect(201);
    await officer
      .post(`/api/cases/${c.id}/summary`, {
        body: "Hello Robin,\n\nWe found condensation on the bedroom window and will fit a fan.",
      })
      .expect(201);
    const subject = `What we found and what happens next: ${c.reference}`;
    await expect.poll(() => t.mail.mails.some((m) => m.subject === subject)).toBe(true);
    const text = t.mail.mails.find((m) => m.subject === subject)!.text;
    expect(text.match(/\bHello\b/g)).toHaveLength(1);
    expect(text).toContain("We found condensation on the bedroom window");
  });
});
