// The maintenance journey in Chromium: the lead orders and books an extractor-fan fix for an
// investigated case, the tenant confirms the slot, the operative completes it with a photo,
// readings after the works show the improvement, and the lead records the fix as effective.
// The work is recorded as done today, before the booked day, so with a reason.
// An axe-core scan of the week board.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { AxeBuilder } from "@axe-core/playwright";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { Case } from "../../server/modules/cases/case.entity.js";
import { launchBrowser, type Browser } from "../support/browser.js";
import { jpegWithGps } from "../support/images.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient, type Client } from "../support/test-app.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { msAgo, testClock, workingDayAhead } from "../support/test-clock.js";

let served: ServedApp;
let browser: Browser;
let sam: Client;
let caseId: number;
let bathroomId: number;
const scratch = mkdtempSync(path.join(tmpdir(), "dewline-e2e-works-"));
const HOUR = 3_600_000;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  // Sam reported condensation mould in the bathroom with two days of readings; an officer has
  // triaged and inspected it (through the API: the officer's journey has its own browser test).
  sam = await signedInClient(served.app, "tenant2@example.org", DEMO_PASSWORD);
  const home = (await sam.get("/api/me/home").expect(200)).body.property;
  bathroomId = home.rooms.find((r: { kind: string }) => r.kind === "bathroom").id;
  caseId = (
    await sam
      .post("/api/cases", {
        description: "Black mould on the bathroom ceiling; the fan makes no noise any more.",
        locations: ["ceiling"],
        observations: ["mould-spots", "condensation"],
        area: "a4",
        vulnerability: [],
        roomIds: [bathroomId],
      })
      .expect(201)
  ).body.id;
  // Before the works: 20 °C, 75 % with the ceiling at 15 °C (surface RH ≈ 103 % → condensing), days 6 to 4 ago.
  await sam
    .post(
      `/api/cases/${caseId}/readings`,
      Array.from({ length: 48 }, (_, h) => ({
        roomId: bathroomId,
        takenAt: msAgo((6 * 24 - h) * HOUR).toISOString(),
        airTemperatureC: 20,
        relativeHumidityPct: 75,
        surfaceTemperatureC: 15,
      })),
    )
    .expect(201);
  const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
  await officer
    .patch(`/api/cases/${caseId}`, {
      status: "triaged",
      hazardClass: "significant",
      reason: "Mould over the bath; the extract fan has failed.",
    })
    .expect(200);
  await officer
    .post(`/api/cases/${caseId}/inspections`, {
      inspectedAt: msAgo(2 * HOUR).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "The bathroom extract fan has failed; condensation mould on the ceiling above the bath.",
      roomReadings: [],
    })
    .expect(201);
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
  rmSync(scratch, { recursive: true, force: true });
});

async function signIn(page: Page, email: string, heading: string) {
  await page.goto(`${served.url}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(heading);
}

async function signOut(page: Page) {
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.getByRole("heading", { name: "Sign in" }).waitFor();
}

/** The next working day at least ten days ahead (clear of the demo's bookings), as YYYY-MM-DD. */
const bookingDay = () => workingDayAhead(10);

it("books, confirms, completes and verifies an extractor-fan fix", async () => {
  const page = await browser.context.newPage();
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, "maintenance@example.org", "Works");

  // axe-core on the week board: no serious or critical findings.
  await page.getByRole("table", { name: /Bookings for the week of/ }).waitFor();
  const scan = await new AxeBuilder({ page }).analyze();
  const bad = scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join("; ")})`)).toEqual([]);

  // The lead orders the fan on the investigated case and books Dale for a morning.
  await page.goto(`${served.url}/cases/${caseId}`);
  await page.getByRole("tab", { name: "Works" }).click();
  const works = page.locator("#case-works");
  await works.getByRole("button", { name: "New work order" }).click();
  await works.getByLabel("Type of work").selectOption("extractor-fan");
  await works
    .getByRole("textbox", { name: "Description" })
    .fill("Replace the failed bathroom extract fan with a continuous-running one with humidity boost.");
  await works.getByRole("button", { name: "Add work order" }).click();
  const order = works.getByRole("listitem").filter({ has: page.getByRole("heading", { name: "Extractor fan: fit or repair" }) });
  await order.getByRole("button", { name: /^Schedule…/ }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel("Operative", { exact: true }).selectOption({ label: "Dale Whitcombe" });
  const day = bookingDay();
  await dialog.getByLabel("Day of the visit", { exact: true }).fill(day);
  await dialog.getByRole("radio", { name: /^Morning/ }).check();
  await dialog.getByRole("button", { name: "Book the visit" }).click();
  await dialog.waitFor({ state: "hidden" });
  await expect.poll(async () => (await order.innerText()).includes("Dale Whitcombe")).toBe(true);
  await signOut(page);

  // Sam confirms the slot on the case page.
  await signIn(page, "tenant2@example.org", "My home");
  await page.goto(`${served.url}/cases/${caseId}`);
  await page.getByRole("button", { name: "Confirm this appointment" }).click();
  await page.getByText("You confirmed this appointment").waitFor();
  await signOut(page);

  // Dale (the operative) records the work with an after-photo.
  await signIn(page, "maintenance@example.org", "Works");
  await page.goto(`${served.url}/cases/${caseId}?tab=works`);
  const done = page
    .locator("#case-works")
    .getByRole("listitem")
    .filter({ has: page.getByRole("heading", { name: "Extractor fan: fit or repair" }) });
  await expect.poll(async () => (await done.innerText()).toLowerCase().includes("confirmed")).toBe(true);
  await done.getByRole("button", { name: /^Record completion…/ }).click();
  // Done today, ahead of the booked day: the day and the reason are asked for.
  await page.getByRole("dialog").getByLabel("Day the work was done").fill(localDate(testClock.now()));
  await page
    .getByRole("dialog")
    .getByRole("textbox", { name: /What was done/ })
    .fill("Fitted a continuous extract fan with humidity boost; tested the run-on and the boost.");
  await page.getByRole("dialog").getByRole("button", { name: "Record completion" }).click();
  await page
    .getByRole("dialog")
    .getByRole("textbox", { name: "Why was it done before the booked day?" })
    .fill("Dale had a cancellation and Sam was at home.");
  await page.getByRole("dialog").getByRole("button", { name: "Record completion" }).click();
  const photo = path.join(scratch, "fan.jpg");
  writeFileSync(photo, await jpegWithGps(1600, 1200));
  await done.getByLabel("Add photos").setInputFiles(photo);
  await done.getByRole("button", { name: "Send after-photo" }).click();
  await done.getByText("1 after-photo added").waitFor();
  await expect
    .poll(async () => (await served.ctx.dataSource.getRepository(Case).findOneByOrFail({ id: caseId })).status)
    .toBe("monitoring");

  // Readings after the works: move the works three days back (as if they were done then), and Sam's
  // hygrometer shows 20 °C and 55 % with the ceiling at 18 °C since.
  const worksDoneAt = msAgo(3 * 24 * HOUR);
  await served.ctx.dataSource
    .getRepository(Case)
    .update(caseId, { worksDoneAt, monitoringEndsAt: new Date(worksDoneAt.getTime() + 21 * 24 * HOUR) });
  await sam
    .post(
      `/api/cases/${caseId}/readings`,
      Array.from({ length: 48 }, (_, h) => ({
        roomId: bathroomId,
        takenAt: new Date(worksDoneAt.getTime() + (h + 1) * HOUR).toISOString(),
        airTemperatureC: 20,
        relativeHumidityPct: 55,
        surfaceTemperatureC: 18,
      })),
    )
    .expect(201);

  // The lead sees the improvement and records the fix as effective.
  await page.reload();
  const verification = page.locator("#case-verification");
  await verification.getByText("Improved", { exact: true }).first().waitFor();
  await verification.getByRole("button", { name: "Fix effective" }).click();
  await verification
    .getByRole("textbox", { name: "What the readings and the visit showed" })
    .fill("Ceiling surface humidity down from over 100 % to about 62 %; no new mould.");
  await verification.getByRole("button", { name: "Record: fix effective…" }).click();
  await page.getByRole("button", { name: "Yes, the fix worked" }).click();
  await verification.getByText("Recorded: the fix was effective").waitFor();
  expect((await served.ctx.dataSource.getRepository(Case).findOneByOrFail({ id: caseId })).status).toBe("closed");
  await page.close();
});
