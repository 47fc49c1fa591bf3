// A report made with no signal, in Chromium: the signal drops mid-report, the report is kept on the
// phone ("waiting to send"), a reload with no signal still opens the app (the service worker serves
// the shell) and still says so, and once the signal is back exactly one case arrives, with its photo
// and its reading.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { jpegWithGps } from "../support/images.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";

let served: ServedApp;
let browser: Browser;
const scratch = mkdtempSync(path.join(tmpdir(), "dewline-e2e-offline-"));
// Our own wording, so this test finds its own case among the demo data.
const DESCRIPTION = "Black spots behind the wardrobe on the outside wall, reported from the stairwell with no signal.";

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.context.setOffline(false);
  await browser?.close();
  await served?.close();
  rmSync(scratch, { recursive: true, force: true });
});

const casesLike = (description: string) =>
  served.ctx.dataSource.query<{ id: number }[]>("SELECT id FROM cases WHERE description = ?", [description]);

it("keeps a report made with no signal on the phone, shows it waiting, and sends it once when the signal returns", async () => {
  const photo = path.join(scratch, "wall.jpg");
  writeFileSync(photo, await jpegWithGps(1200, 900));
  const page = await browser.context.newPage();
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto(`${served.url}/sign-in`);
  await page.getByLabel("E-mail address").fill("tenant@example.org");
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("My home");

  // The service worker has its copy of the app before the signal goes.
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  await page.goto(`${served.url}/report`);
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("Report damp or mould");
  // This page was opened through the worker: a reload with no signal can be served by it.
  expect(await page.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true);
  await page.getByLabel("What can you see?").fill(DESCRIPTION);
  await page.getByLabel("A wall that faces outside").check();
  await page.getByLabel("Black, green or grey spots (mould)").check();
  await page.getByLabel("Bedroom 1").check();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByLabel("Add photos").setInputFiles(photo);

  // The signal drops mid-report.
  await browser.context.setOffline(true);

  await page.getByRole("button", { name: "Next" }).click();
  await page.getByLabel("Room", { exact: true }).selectOption({ label: "Bedroom 1" });
  await page.getByLabel("Air temperature (°C)").fill("17");
  await page.getByLabel("Relative humidity (%)").fill("74");
  await page.getByRole("button", { name: "Add this reading" }).click();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByRole("button", { name: "Send report" }).click();

  const waiting = page.getByText("Your report is waiting to send").first();
  await expect.poll(() => waiting.isVisible()).toBe(true);
  await expect.poll(() => page.getByText(/Kept on this phone: your answers, 1 photo and 1 reading/).isVisible()).toBe(true);
  expect(await casesLike(DESCRIPTION)).toEqual([]);

  // Opened again with no signal: the app still opens and still says the report is waiting.
  await page.reload();
  await expect.poll(() => page.getByText("Your report is waiting to send").first().isVisible()).toBe(true);
  expect(await casesLike(DESCRIPTION)).toEqual([]);

  // The signal returns: the report sends by itself and the tenant sees the real case.
  await browser.context.setOffline(false);
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toMatch(/^DW-\d{4}-\d{5}$/);

  const cases = await casesLike(DESCRIPTION);
  expect(cases).toHaveLength(1);
  const caseId = cases[0]!.id;
  const [photos] = await served.ctx.dataSource.query<{ n: string }[]>("SELECT COUNT(*) AS n FROM photos WHERE case_id = ?", [
    caseId,
  ]);
  const [readings] = await served.ctx.dataSource.query<{ n: string }[]>("SELECT COUNT(*) AS n FROM readings WHERE case_id = ?", [
    caseId,
  ]);
  expect(Number(photos!.n)).toBe(1);
  expect(Number(readings!.n)).toBe(1);

  // Nothing is left waiting on the phone.
  await page.goto(`${served.url}/cases`);
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("My reports");
  expect(await page.getByText("Your report is waiting to send").count()).toBe(0);
  expect(await casesLike(DESCRIPTION)).toHaveLength(1);
  await page.close();
});
