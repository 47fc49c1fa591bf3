// Readings by hand, the evaluation of a case and the officers' alert when a surface is at risk.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { mailSettled, outboxCount } from "../support/outbox.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { daysAgo } from "../support/test-clock.js";

// Reading times a few days back by the test clock, on the hour: at(0) is 07:00 UTC ten days ago.
const BASE_MS = Math.floor(daysAgo(10).getTime() / 86_400_000) * 86_400_000 + 7 * 3_600_000;
const at = (hours: number) => new Date(BASE_MS + hours * 3_600_000).toISOString();

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let caseId: number;
let bedroomId: number;

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const home = (await tenant.get("/api/me/home")).body.property;
  bedroomId = home.rooms.find((r: { kind: string }) => r.kind === "bedroom").id;
  caseId = (
    await tenant
      .post("/api/cases", {
        description: "The bedroom window is streaming every morning.",
        locations: ["window"],
        observations: ["condensation"],
        roomIds: [bedroomId],
      })
      .expect(201)
  ).body.id;
});
afterAll(() => t.close());

describe("readings by hand", () => {
  it("stores readings, skips a duplicate of the same room and time, and evaluates the room", async () => {
    const reading = { roomId: bedroomId, takenAt: at(24), airTemperatureC: 19, relativeHumidityPct: 78, surfaceTemperatureC: 9 };
    const first = await tenant.post(`/api/cases/${caseId}/readings`, [reading]).expect(201);
    expect(first.body).toEqual({ imported: 1, duplicates: 0, rejected: 0 });
    const again = await tenant
      .post(`/api/cases/${caseId}/readings`, [
        reading,
        { roomId: bedroomId, takenAt: at(25), airTemperatureC: 19, relativeHumidityPct: 70 },
      ])
      .expect(201);
    expect(again.body).toEqual({ imported: 1, duplicates: 1, rejected: 0 });
    const events = (await tenant.get(`/api/cases/${caseId}/events`)).body.events.filter(
      (e: { type: string }) => e.type === "readings-added",
    );
    expect(
      events.map((e: { after: { imported: number; duplicates: number } }) => [e.after.imported, e.after.duplicates]),
    ).toEqual([
      [1, 0],
      [1, 1],
    ]);

    const list = await tenant.get(`/api/cases/${caseId}/readings`).expect(200);
    expect(list.body.readings.map((r: { relativeHumidityPct: number }) => r.relativeHumidityPct)).toEqual([78, 70]);

    // The evaluation is brought up to date in the background after readings are added.
    await t.ctx.services.readings.whenIdle();
    const evaluation = await tenant.get(`/api/cases/${caseId}/evaluation`).expect(200);
    expect(evaluation.body.statement).toMatch(/whatever the readings show/);
    const room = evaluation.body.rooms[0];
    expect(room).toMatchObject({ roomId: bedroomId, readingsCount: 2 });
    // The home in the factory has single glazing; the latest reading has no surface temperature
    // and no outdoor temperature, so the surface is taken at air temperature.
    expect(room.surfaces[0].element).toBe("single-glazing");
    expect(room.surfaces[0].result.surface.source).toBe("air");
    expect(room.series.count).toBe(2);
  });

  it("evaluates a measured window surface at 9 °C with air at 19 °C / 78 % as condensing and alerts the officers once", async () => {
    const c = (
      await tenant
        .post("/api/cases", {
          description: "Window streaming.",
          locations: ["window"],
          observations: ["condensation"],
          roomIds: [bedroomId],
        })
        .expect(201)
    ).body;
    await mailSettled(t);
    const before = t.mail.mails.filter((m) => m.to.includes(landlord.officer.email)).length;
    await tenant
      .post(`/api/cases/${c.id}/readings`, [
        { roomId: bedroomId, takenAt: at(48), airTemperatureC: 19, relativeHumidityPct: 78, surfaceTemperatureC: 9 },
      ])
      .expect(201);
    await t.ctx.services.readings.whenIdle();
    const evaluation = await tenant.get(`/api/cases/${c.id}/evaluation`).expect(200);
    expect(evaluation.body.rooms[0].surfaces[0].result.surface).toMatchObject({
      source: "measured",
      temperatureC: 9,
      state: "condensing",
    });
    const alert = await t.mail.lastTo(landlord.officer.email);
    expect(alert.subject).toContain(c.reference);
    expect(alert.raw).toMatch(/condensing/);
    await tenant
      .post(`/api/cases/${c.id}/readings`, [
        { roomId: bedroomId, takenAt: at(49), airTemperatureC: 19, relativeHumidityPct: 80, surfaceTemperatureC: 8 },
      ])
      .expect(201);
    // Once: one alert to this officer about this case in the outbox, written before the second reply.
    expect(await outboxCount(t.ctx.dataSource, { to: landlord.officer.email, template: "caseAlert", caseId: c.id })).toBe(1);
    expect(t.mail.mails.filter((m) => m.to.includes(landlord.officer.email)).length).toBe(before + 1);
  });

  it("validates every reading and changes nothing when one is bad", async () => {
    const good = { roomId: bedroomId, takenAt: at(0), airTemperatureC: 18, relativeHumidityPct: 60 };
    const count = (await tenant.get(`/api/cases/${caseId}/readings`)).body.readings.length;
    const bad = await tenant
      .post(`/api/cases/${caseId}/readings`, [good, { ...good, takenAt: at(1), relativeHumidityPct: 101 }])
      .expect(400);
    expect(bad.body.error.details[0].field).toBe("1.relativeHumidityPct");
    await tenant.post(`/api/cases/${caseId}/readings`, [{ ...good, airTemperatureC: "warm" }]).expect(400);
    await tenant.post(`/api/cases/${caseId}/readings`, [{ ...good, takenAt: "yesterday" }]).expect(400);
    await tenant.post(`/api/cases/${caseId}/readings`, []).expect(400);
    const other = await makeLandlord(t.ctx.dataSource);
    const foreignRoom = (
      await (await signedInClient(t.app, other.officer.email, PASSWORD)).get(`/api/properties/${other.home.id}`)
    ).body.rooms[0].id;
    const wrongRoom = await tenant.post(`/api/cases/${caseId}/readings`, [{ ...good, roomId: foreignRoom }]).expect(400);
    expect(wrongRoom.body.error.details[0].field).toBe("roomId");
    expect((await tenant.get(`/api/cases/${caseId}/readings`)).body.readings.length).toBe(count);
  });

  it("keeps readings and evaluations to the case's tenant and landlord", async () => {
    const neighbour = await makeTenant(t.ctx.dataSource, landlord.org, await makeProperty(t.ctx.dataSource, landlord.org));
    const client = await signedInClient(t.app, neighbour.email, PASSWORD);
    await client.get(`/api/cases/${caseId}/readings`).expect(404);
    await client.get(`/api/cases/${caseId}/evaluation`).expect(404);
    await client
      .post(`/api/cases/${caseId}/readings`, [
        { roomId: bedroomId, takenAt: at(0), airTemperatureC: 18, relativeHumidityPct: 60 },
      ])
      .expect(404);
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    await officer.get(`/api/cases/${caseId}/evaluation`).expect(200);
  });
});

describe("logger CSV import through the API", () => {
  const csv = (rows: string[]) => Buffer.from(["Timestamp,Temperature (°C),Humidity (%rh)", ...rows].join("\n"));
  const thousandRows = () => {
    const rows: string[] = [];
    for (let i = 0; i < 1000; i++) {
      const time = new Date(BASE_MS - 28 * 86_400_000 + i * 600_000).toISOString();
      rows.push(`${time},${(18 + (i % 10) / 10).toFixed(1)},${65 + (i % 20)}`);
    }
    rows[99] = rows[99]!.replace(/,[\d.]+,/, ",warm,"); // line 101
    rows[499] = rows[499]!.replace(/,\d+$/, ",130"); // line 501
    rows[899] = "not a time,18.0,70"; // line 901
    return csv(rows);
  };
  const post = (client: Client, url: string, file: Buffer, fields: Record<string, string> = {}) => {
    const req = client.agent.post(url).set("X-CSRF-Token", client.csrf);
    for (const [k, v] of Object.entries(fields)) req.field(k, v);
    return req.attach("file", file, "logger export.csv");
  };

  it("previews the columns, imports 997 of 1 000 rows, reports the 3 bad rows by line, and records it on the timeline", async () => {
    const file = thousandRows();
    const preview = await post(tenant, `/api/cases/${caseId}/readings/import/preview`, file).expect(200);
    expect(preview.body.mapping).toMatchObject({ timestamp: 0, temperature: 1, humidity: 2, temperatureUnit: "C" });
    expect(preview.body.sampleRows).toHaveLength(10);

    const res = await post(tenant, `/api/cases/${caseId}/readings/import`, file, { roomId: String(bedroomId) }).expect(201);
    expect(res.body).toMatchObject({ imported: 997, duplicates: 0, rejected: 3 });
    const report = await tenant.agent.get(res.body.rejectedReportUrl).expect(200);
    expect(report.headers["content-type"]).toMatch(/text\/csv/);
    const lines = report.text.trim().split("\n").slice(1);
    expect(lines.map((l) => l.split(",")[0])).toEqual(["101", "501", "901"]);

    const again = await post(tenant, `/api/cases/${caseId}/readings/import`, file, { roomId: String(bedroomId) }).expect(201);
    expect(again.body).toMatchObject({ imported: 0, duplicates: 997, rejected: 3 });
    const events = (await tenant.get(`/api/cases/${caseId}/events`)).body.events.filter(
      (e: { type: string }) => e.type === "readings-imported",
    );
    expect(events.at(-2).after).toMatchObject({ imported: 997, rejected: 3, fileName: "logger export.csv" });
  });

  it("answers 422 for a file that is not UTF-8 text or has no columns we can use, and 400 without a room", async () => {
    const latin1 = Buffer.concat([
      Buffer.from("Zeit,Temperatur,Feuchte\n2026-11-01 10:00,18,70\n"),
      Buffer.from([0xe9, 0xff, 0xfe, 0x0a]),
    ]);
    await post(tenant, `/api/cases/${caseId}/readings/import`, latin1, { roomId: String(bedroomId) }).expect(422);
    const noColumns = await post(tenant, `/api/cases/${caseId}/readings/import`, Buffer.from("name,colour\nsofa,green\n"), {
      roomId: String(bedroomId),
    }).expect(422);
    expect(noColumns.body.error.message).toBeTruthy();
    await post(tenant, `/api/cases/${caseId}/readings/import`, thousandRows()).expect(400);
  });

  it("does not let another tenant import into or download from the case", async () => {
    const neighbour = await makeTenant(t.ctx.dataSource, landlord.org, await makeProperty(t.ctx.dataSource, landlord.org));
    const client = await signedInClient(t.app, neighbour.email, PASSWORD);
    await post(client, `/api/cases/${caseId}/readings/import`, thousandRows(), { roomId: String(bedroomId) }).expect(404);
    await client.agent.get(`/api/cases/${caseId}/readings/imports/1/rejected.csv`).expect(404);
  });
});
