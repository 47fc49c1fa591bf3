// Exports in Chromium: on a case's readings tab an officer picks a room and downloads its readings as
// CSV from the link under the table; the file (read back with csv-parse) holds that room's readings,
// all of them, with where each came from in the screen's words.
import { readFileSync } from "node:fs";
import { parse as parseCsv } from "csv-parse/sync";
import { afterAll, beforeAll, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { signIn } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

let served: ServedApp;
let browser: Browser;
/** A demo case with readings, and the room the test adds readings to and picks. */
let target: { caseId: number; roomId: number; roomName: string; count: number };

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
  // A demo case with readings, and three readings by hand in another room of its home.
  const queue = (await officer.get("/api/cases?pageSize=200").expect(200)).body.items as { id: number }[];
  for (const { id } of queue) {
    const readings = (await officer.get(`/api/cases/${id}/readings`).expect(200)).body.readings as { roomId: number }[];
    if (!readings.length) continue;
    const c = (await officer.get(`/api/cases/${id}`).expect(200)).body as { homeRooms: { id: number; name: string }[] };
    const room = c.homeRooms.find((r) => !readings.some((reading) => reading.roomId === r.id));
    if (!room) continue;
    await officer
      .post(
        `/api/cases/${id}/readings`,
        [3, 2, 1].map((days) => ({
          roomId: room.id,
          takenAt: msAgo(days * 86_400_000).toISOString(),
          airTemperatureC: 17.5,
          relativeHumidityPct: 78,
        })),
      )
      .expect(201);
    target = { caseId: id, roomId: room.id, roomName: room.name, count: 3 };
    break;
  }
  expect(target, "the demo has a case with readings and a room without").toBeDefined();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

it("an officer downloads the readings of the room on screen, in the screen's words", async () => {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await signIn(page, served.url, "officer@example.org");
  await page.goto(`${served.url}/cases/${target.caseId}?tab=readings`);
  await page.getByLabel("Show readings for").selectOption(String(target.roomId));
  await page.getByRole("table", { name: new RegExp(`Readings in ${target.roomName}`) }).waitFor();

  const link = page.getByRole("link", { name: `CSV file of the readings in ${target.roomName}` });
  const [download] = await Promise.all([page.waitForEvent("download"), link.click()]);
  const file = await download.path();
  const rows = parseCsv(readFileSync(file), { bom: true }) as string[][];
  expect(rows[0]?.[1]).toBe("Room");
  expect(rows[0]?.[6]).toBe("Source");
  expect(rows).toHaveLength(1 + target.count);
  expect(new Set(rows.slice(1).map((r) => r[1]))).toEqual(new Set([target.roomName]));
  expect(rows.slice(1).map((r) => r[6])).toEqual(["By hand", "By hand", "By hand"]);
});
