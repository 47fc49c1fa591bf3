// Staff-only text never reaches the tenant. A case is taken through the whole journey with a unique
// marker in every staff-only field (the operative's description of each work order, an internal note,
// the inspection's findings and room notes, the HHSRS justification, the hazard classification's
// reason, a manual status reason, the early-completion reason, materials, follow-on work and the
// "fix effective" override). Then every route of ENDPOINTS a tenant may call is called as the tenant
// (its `:id` filled from the case), and every e-mail and calendar file the tenant received is read:
// the marker appears in none of them. A new tenant-facing route fails here until it is covered.
import { afterAll, beforeAll, expect, it } from "vitest";
import { ENDPOINTS, type Endpoint } from "../../src/lib/contracts/endpoints.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { jpegWithGps } from "../support/images.js";
import { mailSettled, outboxRows } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, testClock, workingDaysAhead } from "../support/test-clock.js";

const MARKER = "STAFFONLY-7Q4Z";
const staffText = (what: string) => `${what} ${MARKER} (for staff).`;

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
const params: Record<string, number> = {};
/** Replies the tenant got from the non-GET routes the journey called, by "METHOD path". */
const tenantReplies = new Map<string, string>();

const record = (method: string, path: string, body: string) => tenantReplies.set(`${method} ${path}`, body);

/** Routes a tenant may call that are not about a case and carry nothing staff write. */
const NOT_ABOUT_A_CASE: Record<string, string> = {
  "POST /api/auth/login": "answers with the signed-in user only",
  "POST /api/auth/logout": "no body",
  "POST /api/auth/invitations/accept": "no body",
  "GET /api/auth/invitations/:token": "the invitation's own name, e-mail and organisation",
  "POST /api/auth/password-reset": "the same answer whoever asks",
  "POST /api/auth/password-reset/confirm": "no body",
  "POST /api/auth/sign-in-unlock/request": "the same answer whoever asks",
  "POST /api/auth/sign-in-unlock": "no body",
  "POST /api/psychrometrics/evaluate": "the risk engine on the numbers sent; reads nothing stored",
  "POST /api/psychrometrics/series": "the risk engine on the numbers sent; reads nothing stored",
  "POST /api/sensor-ingest/readings": "a sensor's own secret only (no session opens it); answers with counts and reasons",
};

const tenantMay = (e: Endpoint) =>
  e.access === "public" || e.access === "signed-in" || (Array.isArray(e.access) && e.access.includes("tenant"));

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  const lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);

  // Texts on, so the journey's appointment offers and replies are texted too (and their timeline entries checked).
  const texts = await tenant.agent
    .put("/api/me/texts")
    .set("X-CSRF-Token", tenant.csrf)
    .send({ mobileNumber: "07700 900987", textsOn: true })
    .expect(200);
  record("PUT", "/api/me/texts", texts.text);
  // English chosen (the e-mails' words are checked in English below).
  const language = await tenant.agent
    .put("/api/me/language")
    .set("X-CSRF-Token", tenant.csrf)
    .send({ language: "en" })
    .expect(200);
  record("PUT", "/api/me/language", language.text);

  const home = (await tenant.get("/api/me/home").expect(200)).body.property;
  const roomId: number = home.rooms[0].id;
  const created = await tenant
    .post("/api/cases", {
      description: "Black mould on the bedroom wall behind the wardrobe.",
      locations: ["external-wall"],
      observations: ["mould-spots"],
      roomIds: [roomId],
    })
    .expect(201);
  record("POST", "/api/cases", created.text);
  const caseId: number = created.body.id;
  params.id = caseId;

  // The tenant's own photos, readings and a logger file with one bad row.
  const photo = await tenant.agent
    .post(`/api/cases/${caseId}/photos`)
    .set("X-CSRF-Token", tenant.csrf)
    .attach("photos", await jpegWithGps(800, 600, 3), "wall.jpg")
    .expect(201);
  record("POST", "/api/cases/:id/photos", photo.text);
  params.photoId = photo.body.photos[0].id;
  const readings = await tenant
    .post(`/api/cases/${caseId}/readings`, [
      { roomId, takenAt: hoursAgo(30).toISOString(), airTemperatureC: 18, relativeHumidityPct: 78, surfaceTemperatureC: 12 },
    ])
    .expect(201);
  record("POST", "/api/cases/:id/readings", readings.text);
  const stamp = (h: number) => hoursAgo(h).toISOString().slice(0, 16).replace("T", " ");
  const csv = Buffer.from(`Time,Temperature,RH\n${stamp(50)}Z,19.5,72\n${stamp(49)}Z,abc,70\n${stamp(48)}Z,20.1,69\n`);
  const preview = await tenant.agent
    .post(`/api/cases/${caseId}/readings/import/preview`)
    .set("X-CSRF-Token", tenant.csrf)
    .attach("file", csv, "logger.csv")
    .expect(200);
  record("POST", "/api/cases/:id/readings/import/preview", preview.text);
  const imported = await tenant.agent
    .post(`/api/cases/${caseId}/readings/import`)
    .set("X-CSRF-Token", tenant.csrf)
    .field("roomId", String(roomId))
    .attach("file", csv, "logger.csv")
    .expect(201);
  record("POST", "/api/cases/:id/readings/import", imported.text);
  params.importId = imported.body.importId;

  // Staff at work, writing staff-only text everywhere they can.
  await officer
    .patch(`/api/cases/${caseId}`, { status: "triaged", hazardClass: "significant", reason: staffText("Hazard reason") })
    .expect(200);
  await officer
    .post(`/api/cases/${caseId}/inspections`, {
      inspectedAt: hoursAgo(2).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: `${staffText("Raw findings")} <b>Wardrobe against a cold wall.</b>`,
      roomReadings: [{ roomId, airTemperatureC: 18, relativeHumidityPct: 70, note: staffText("Room note") }],
    })
    .expect(201);
  await officer
    .post(`/api/cases/${caseId}/assessments`, {
      likelihood: 180,
      spread: [0, 0.2, 10, 89.8],
      justification: staffText("HHSRS justification"),
    })
    .expect(201);
  await officer.post(`/api/cases/${caseId}/messages`, { body: staffText("Internal note"), internal: true }).expect(201);
  await officer
    .post(`/api/cases/${caseId}/summary`, {
      body: "We found condensation mould on the bedroom wall and will fit a fan and wash the wall.",
    })
    .expect(201);
  await officer.post(`/api/cases/${caseId}/messages`, { body: "We will book the work this week.", internal: false }).expect(201);

  const fan = (
    await officer
      .post(`/api/cases/${caseId}/work-orders`, { type: "extractor-fan", description: staffText("Operative description, fan") })
      .expect(201)
  ).body;
  const wash = (
    await officer
      .post(`/api/cases/${caseId}/work-orders`, { type: "mould-wash", description: staffText("Operative description, wash") })
      .expect(201)
  ).body;
  params.workOrderId = fan.id;
  const [first, second, third] = workingDaysAhead(12, 3);
  await lead
    .patch(`/api/work-orders/${fan.id}`, { assigneeId: landlord.maintenance.id, slot: { date: first, window: "am" } })
    .expect(200);
  await lead
    .patch(`/api/work-orders/${fan.id}`, { assigneeId: landlord.maintenance.id, slot: { date: second, window: "pm" } })
    .expect(200);
  const confirmed = await tenant.post(`/api/work-orders/${fan.id}/booking-response`, { response: "confirm" }).expect(200);
  record("POST", "/api/work-orders/:id/booking-response", confirmed.text);
  await lead
    .patch(`/api/work-orders/${wash.id}`, { assigneeId: landlord.maintenance.id, slot: { date: third, window: "all-day" } })
    .expect(200);
  await lead.patch(`/api/work-orders/${wash.id}`, { cancel: { reason: "The fan comes first." } }).expect(200);
  const today = localDate(testClock.now());
  await lead
    .patch(`/api/work-orders/${fan.id}`, {
      complete: {
        note: "Fitted a continuous extract fan and tested it.",
        doneOn: today,
        earlyReason: staffText("Early reason"),
        materials: staffText("Materials"),
        followOn: staffText("Follow-on work"),
      },
    })
    .expect(200);
  // The follow-on work became an order (its description is the follow-on text): done too, into monitoring.
  const followOn = (await lead.get(`/api/cases/${caseId}/work-orders`).expect(200)).body.workOrders.find(
    (o: { status: string }) => o.status === "unscheduled",
  );
  await lead
    .patch(`/api/work-orders/${followOn.id}`, { complete: { note: "Washed the wall with fungicide.", doneOn: today } })
    .expect(200);
  await lead
    .post(`/api/cases/${caseId}/verification`, {
      effective: true,
      note: "The wall is dry and clean.",
      override: { reason: staffText("Override reason") },
    })
    .expect(200);

  const worse = await tenant.post(`/api/cases/${caseId}/worse`, { note: "A small spot is back by the window." });
  record("POST", "/api/cases/:id/worse", worse.text);
  // The tenant writes to the landlord and marks the conversation read.
  const message = await tenant
    .post(`/api/cases/${caseId}/messages`, { body: "Thank you, the fan is much quieter than the old one." })
    .expect(201);
  record("POST", "/api/cases/:id/messages", message.text);
  const read = await tenant.post(`/api/cases/${caseId}/messages/read`, {}).expect(200);
  record("POST", "/api/cases/:id/messages/read", read.text);

  // A formal complaint, with a staff-only note on every move staff make; the tenant escalates it.
  const raised = await tenant
    .post(`/api/cases/${caseId}/complaints`, { description: "It took three weeks for anyone to come." })
    .expect(201);
  record("POST", "/api/cases/:id/complaints", raised.text);
  const complaintId: number = raised.body.id;
  const put = (url: string, body: object) => officer.agent.put(url).set("X-CSRF-Token", officer.csrf).send(body);
  await officer
    .post(`/api/complaints/${complaintId}/acknowledge`, { version: 1, note: staffText("Complaint note, ack") })
    .expect(200);
  await officer
    .post(`/api/complaints/${complaintId}/extend`, {
      version: 2,
      workingDays: 5,
      reason: "We are waiting for the roofer's report.",
      note: staffText("Complaint note, extension"),
    })
    .expect(200);
  await put(`/api/complaints/${complaintId}/remedy`, {
    version: 3,
    apology: true,
    putRight: "We will treat the wall again.",
    note: staffText("Complaint note, remedy"),
  }).expect(200);
  await officer
    .post(`/api/complaints/${complaintId}/respond`, {
      version: 4,
      response: "We should have come sooner.",
      note: staffText("Complaint note, response"),
    })
    .expect(200);
  const escalated = await tenant
    .post(`/api/complaints/${complaintId}/escalate`, { version: 5, reason: "The wall is still damp." })
    .expect(200);
  record("POST", "/api/complaints/:id/escalate", escalated.text);
});
afterAll(() => t.close());

it("puts the marker where staff can read it (so its absence below means something)", async () => {
  const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  const staffSees = [
    (await officer.get(`/api/cases/${params.id}/events`).expect(200)).text,
    (await officer.get(`/api/cases/${params.id}/work-orders`).expect(200)).text,
    (await officer.get(`/api/cases/${params.id}/inspections`).expect(200)).text,
    (await officer.get(`/api/cases/${params.id}`).expect(200)).text,
  ].join("\n");
  for (const what of [
    "Hazard reason",
    "Raw findings",
    "Room note",
    "Internal note",
    "Operative description, fan",
    "Follow-on work",
    "Complaint note, ack",
    "Complaint note, remedy",
  ])
    expect(staffSees).toContain(`${what} ${MARKER}`);
  await mailSettled(t);
  const operative = t.mail.mails
    .filter((m) => m.to.includes(landlord.maintenance.email))
    .map((m) => m.raw.replace(/\r?\n[ \t]/g, ""));
  expect(operative.join("\n")).toContain(MARKER);
});

it("is absent from every route a tenant may call", async () => {
  const covered: string[] = [];
  for (const endpoint of ENDPOINTS.filter(tenantMay)) {
    const key = `${endpoint.method} ${endpoint.path}`;
    if (NOT_ABOUT_A_CASE[key]) continue;
    if (endpoint.method !== "GET") {
      const reply = tenantReplies.get(key);
      expect(reply, `${key}: the journey above must call it as the tenant`).toBeDefined();
      expect(reply, key).not.toContain(MARKER);
      covered.push(key);
      continue;
    }
    const path = endpoint.path.replace(/:([A-Za-z]+)/g, (_, name: string) => {
      const value = name === "id" && endpoint.path.startsWith("/api/photos/") ? params.photoId : params[name];
      if (value === undefined) throw new Error(`${key}: no fixture value for :${name}`);
      return String(value);
    });
    const res = await tenant.get(path);
    expect(res.status, `${key} → ${res.status} ${(res.text ?? "").slice(0, 200)}`).toBe(endpoint.status);
    const body = Buffer.isBuffer(res.body) ? res.body.toString("latin1") : res.text;
    expect(body, key).not.toContain(MARKER);
    covered.push(key);
  }
  // The tenant's case routes are all there, not a handful.
  expect(covered).toEqual(
    expect.arrayContaining([
      "GET /api/cases/:id",
      "GET /api/cases/:id/events",
      "GET /api/cases/:id/work-orders",
      "GET /api/cases/:id/verification",
      "GET /api/me/cases",
      "GET /api/me/home",
      "GET /api/me/outlook",
      "POST /api/work-orders/:id/booking-response",
      "GET /api/cases/:id/complaints",
      "POST /api/complaints/:id/escalate",
    ]),
  );
});

it("is absent from every e-mail and calendar file the tenant received", async () => {
  const rows = await outboxRows(t.ctx.dataSource, { to: landlord.tenant.email, caseId: params.id });
  const templates = new Set(rows.map((r) => r.template));
  for (const expected of [
    "appointmentProposed",
    "appointmentConfirmed",
    "appointmentCancelled",
    "monitoringStarted",
    "fixConfirmed",
    "complaintLetter",
  ])
    expect([...templates]).toContain(expected);
  const toTenant = () => t.mail.mails.filter((m) => m.to.includes(landlord.tenant.email));
  await expect.poll(() => toTenant().length).toBeGreaterThanOrEqual(rows.length);
  const mails = toTenant();
  const calendars = mails.flatMap((m) => m.raw.match(/BEGIN:VCALENDAR[\s\S]*?END:VCALENDAR/g) ?? []);
  expect(calendars.length).toBeGreaterThanOrEqual(4);
  for (const m of mails) expect(m.raw.replace(/\r?\n[ \t]/g, ""), m.subject).not.toContain(MARKER);
  for (const r of rows) expect(`${r.subject}`, r.template).not.toContain(MARKER);
});
