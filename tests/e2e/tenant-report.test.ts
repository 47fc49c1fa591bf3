// The tenant journey in Chromium: report a steamed-up bedroom window with a photo and a reading,
// see the condensing state and the advice, and find the case with its photo on the list.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { AxeBuilder } from "@axe-core/playwright";
import { afterAll, beforeAll, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { jpegWithGps } from "../support/images.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";

let served: ServedApp;
let browser: Browser;
const scratch = mkdtempSync(path.join(tmpdir(), "dewline-e2e-"));

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
  rmSync(scratch, { recursive: true, force: true });
});

it("reports a steamed-up bedroom window with a photo and 19 °C / 78 % with the window at 9 °C, and sees it is condensing", async () => {
  const photo = path.join(scratch, "window.jpg");
  writeFileSync(photo, await jpegWithGps(1600, 1200));
  const page = await browser.context.newPage();
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto(`${served.url}/sign-in`);
  await page.getByLabel("E-mail address").fill("tenant@example.org");
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("My home");

  await page.goto(`${served.url}/report`);
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("Report damp or mould");

  // axe-core on the report form's first step: no serious or critical findings.
  const scan = await new AxeBuilder({ page }).analyze();
  const bad = scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${v.id}: ${v.help}`)).toEqual([]);

  await page.getByLabel("What can you see?").fill("The bedroom window is steamed up every morning and water runs onto the sill.");
  await page.getByLabel("Window or window frame").check();
  await page.getByLabel("Water on the glass or sills").check();
  await page.getByLabel("Bedroom 1").check();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByLabel("Add photos").setInputFiles(photo);
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByLabel("Room", { exact: true }).selectOption({ label: "Bedroom 1" });
  await page.getByLabel("Air temperature (°C)").fill("19");
  await page.getByLabel("Relative humidity (%)").fill("78");
  await page.getByLabel("Surface temperature (°C)").fill("9");
  await page.getByRole("button", { name: "Add this reading" }).click();
  await page.getByRole("button", { name: "Next" }).click();
  await page.getByRole("button", { name: "Send report" }).click();

  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toMatch(/^DW-\d{4}-\d{5}$/);
  const reference = (await page.getByRole("heading", { level: 1 }).textContent())!;
  await expect.poll(() => page.getByText("Condensing", { exact: true }).first().isVisible()).toBe(true);
  // The advice and the cautions are there, and the promise that the landlord will look into it.
  await expect
    .poll(() =>
      page
        .getByText(/whatever the readings show/i)
        .first()
        .isVisible(),
    )
    .toBe(true);
  await expect
    .poll(() =>
      page
        .getByText(/oven|gas hob/i)
        .first()
        .isVisible(),
    )
    .toBe(true);

  await page.goto(`${served.url}/cases`);
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("My reports");
  const card = page.getByRole("listitem").filter({ hasText: reference });
  await expect.poll(() => card.count()).toBe(1);
  const thumb = card.getByRole("img", { name: `First sent with ${reference}` });
  await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
  await page.close();
});
