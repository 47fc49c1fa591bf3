// Where a readings CSV upload is written while it is received: the app's own incoming folder
// (UPLOADS_DIR/.incoming, swept of a crash's leftovers at start-up), not a folder shared by every
// instance on the machine; and a refused or failed upload leaves nothing there.
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { daysAgo } from "../support/test-clock.js";

function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, encoding: "utf8" }).filter((f) => statSync(path.join(dir, f)).isFile());
}

describe("readings CSV uploads", () => {
  const uploads = mkdtempSync(path.join(tmpdir(), "dewline-test-csv-uploads-"));
  const incoming = path.join(uploads, ".incoming");
  let t: TestApp;
  let tenant: Client;
  let caseId: number;
  let bedroomId: number;

  const csv = (n: number) => {
    const rows = ["Timestamp,Temperature (°C),Humidity (%rh)"];
    const start = Math.floor(daysAgo(30).getTime() / 3_600_000) * 3_600_000;
    for (let i = 0; i < n; i++) rows.push(`${new Date(start + i * 600_000).toISOString()},19.5,${60 + (i % 30)}`);
    return Buffer.from(rows.join("\n"));
  };
  const post = (url: string, file: Buffer, fields: Record<string, string> = {}) => {
    const req = tenant.agent.post(url).set("X-CSRF-Token", tenant.csrf);
    for (const [k, v] of Object.entries(fields)) req.field(k, v);
    return req.attach("file", file, "logger.csv");
  };
  const readingsCount = async () => (await tenant.get(`/api/cases/${caseId}/readings`).expect(200)).body.readings.length;

  beforeAll(async () => {
    t = await createTestApp({ UPLOADS_DIR: uploads });
    const landlord = await makeLandlord(t.ctx.dataSource);
    tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    const rooms = (await tenant.get("/api/me/home")).body.property.rooms as { id: number; kind: string }[];
    bedroomId = rooms.find((r) => r.kind === "bedroom")!.id;
    caseId = (
      await tenant
        .post("/api/cases", {
          description: "Damp on the bedroom wall.",
          locations: ["window"],
          observations: ["wet-patches"],
          roomIds: [bedroomId],
        })
        .expect(201)
    ).body.id;
  });
  afterAll(async () => {
    await t.close();
    rmSync(uploads, { recursive: true, force: true });
  });

  it("is received into the app's own incoming folder: when that cannot be written, 503 and nothing imported", async () => {
    // A file where the folder should be: nothing can be written into it.
    rmSync(incoming, { recursive: true, force: true });
    writeFileSync(incoming, "not a folder");
    try {
      const res = await post(`/api/cases/${caseId}/readings/import`, csv(20), { roomId: String(bedroomId) }).expect(503);
      expect(res.headers["retry-after"]).toBeDefined();
      expect(await readingsCount()).toBe(0);
    } finally {
      rmSync(incoming, { force: true });
      mkdirSync(incoming, { recursive: true });
    }
  });

  it("leaves no file in the incoming folder after refused and failed uploads", async () => {
    const base = `/api/cases/${caseId}/readings/import`;
    const before = await readingsCount();
    // no room, a room of another home, text that is not UTF-8, a file with no readings columns
    await post(base, csv(5)).expect(400);
    await post(base, csv(5), { roomId: "999999" }).expect(400);
    await post(base, Buffer.from("Zeit,Temp\n2025-01-15 07:00,\xe9\n", "latin1"), { roomId: String(bedroomId) }).expect(422);
    await post(base, Buffer.from("name,colour\nsofa,green\n"), { roomId: String(bedroomId) }).expect(422);
    await post(`${base}/preview`, Buffer.from("\xff\xfe\x00", "latin1")).expect(422);
    expect(filesUnder(incoming)).toEqual([]);
    expect(await readingsCount()).toBe(before);

    // and a good one is removed by the time the answer comes
    await post(base, csv(20), { roomId: String(bedroomId) }).expect(201);
    expect(filesUnder(incoming)).toEqual([]);
    expect(await readingsCount()).toBe(20);
  });
});
