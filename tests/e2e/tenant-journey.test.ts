// The tenant's journey at a phone's and a laptop's width: report with photos (one file is not a
// photo and is refused by name before anything is sent; the good one's preview loads under the
// security policy with no console error), a reading that puts the window below the dew point, and a
// case page that says "condensing" instead of a surface humidity over 100 %. axe-core on every page.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { jpegWithGps } from "../support/images.js";
import { consoleErrors, expectAccessible, signIn, VIEWPORTS } from "../support/journey.js";
import { serveDemoApp, type ServedApp } from "../support/served-app.js";

let served: ServedApp;
let browser: Browser;
const scratch = mkdtempSync(path.join(tmpdir(), "dewline-e2e-tenant-"));

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
  rmSync(scratch, { recursive: true, force: true });
});

/** A surface humidity written as a percentage over 100 ("149 %"). */
const OVER_100 = /\b(1\d\d|[2-9]\d\d)(\.\d+)? ?%/;

describe.each(Object.entries(VIEWPORTS))("the tenant's report at %s size", (name, size) => {
  it("sends photos and a reading, refuses a non-photo by name first, and shows condensing in words", async () => {
    const good = path.join(scratch, `${name}-window.jpg`);
    writeFileSync(good, await jpegWithGps(1200, 900, name === "phone" ? 3 : 4));
    const notPhoto = path.join(scratch, `${name}-notes.txt`);
    writeFileSync(notPhoto, "not a photo");

    // One browser profile for both sizes: start each walk signed out.
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.setViewportSize(size);
    const photoPosts: string[] = [];
    page.on("request", (r) => {
      if (r.method() === "POST" && /\/api\/cases\/\d+\/photos$/.test(new URL(r.url()).pathname)) photoPosts.push(r.url());
    });

    await signIn(page, served.url, "tenant@example.org");
    // From here on (the sign-in page's "who am I?" answers 401 before signing in, as it should).
    const errors = consoleErrors(page);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("My home");
    await expectAccessible(page);

    await page.goto(`${served.url}/report`);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("Report damp or mould");
    await expectAccessible(page);
    await page.getByLabel("What can you see?").fill("The bedroom window runs with water every morning.");
    await page.getByLabel("Window or window frame").check();
    await page.getByLabel("Water on the glass or sills").check();
    await page.getByLabel("Bedroom 1").check();
    await page.getByRole("button", { name: "Next" }).click();
    await page.getByRole("button", { name: "Next" }).click();
    await page.getByRole("button", { name: "Next" }).click();

    // Photos: the text file is refused by its name before anything is sent; the photo is kept and previewed.
    await page.getByLabel("Add photos").setInputFiles([good, notPhoto]);
    const refusal = page.getByRole("alert").filter({ hasText: "One file could not be added" });
    await expect.poll(() => refusal.textContent()).toContain(`${name}-notes.txt`);
    const preview = page.getByRole("img", { name: `Chosen file 1, ${name}-window.jpg` });
    await expect.poll(() => preview.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
    expect(await page.getByRole("list", { name: "Photos you have chosen" }).getByRole("listitem").count()).toBe(1);
    expect(photoPosts).toEqual([]);
    await expectAccessible(page);
    await page.getByRole("button", { name: "Next" }).click();

    // 19 °C at 78 % with the window at 9 °C: about 149 % as the engine's raw ratio.
    await page.getByLabel("Room", { exact: true }).selectOption({ label: "Bedroom 1" });
    await page.getByLabel("Air temperature (°C)").fill("19");
    await page.getByLabel("Relative humidity (%)").fill("78");
    await page.getByLabel("Surface temperature (°C)").fill("9");
    await page.getByRole("button", { name: "Add this reading" }).click();
    await page.getByRole("button", { name: "Next" }).click();

    // Check and send: one card per step, each with its own way back.
    await expect.poll(() => page.getByRole("button", { name: /^Change/ }).count()).toBeGreaterThanOrEqual(5);
    await expectAccessible(page);
    await page.getByRole("button", { name: "Send report" }).click();

    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toMatch(/^DW-\d{4}-\d{5}$/);
    await expect.poll(() => page.getByText("Condensing", { exact: true }).first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText("condensing (the surface is below the dew point)").first().isVisible()).toBe(true);
    expect(await page.locator("main").innerText()).not.toMatch(OVER_100);
    expect(photoPosts).toHaveLength(1);
    // The photo that went up shows on the case page, under its heading.
    await page.getByRole("button", { name: "Photos", exact: true }).click();
    const thumbs = page.locator("main img[src^='/api/photos/']");
    await expect.poll(() => thumbs.count()).toBeGreaterThanOrEqual(1);
    await thumbs.first().scrollIntoViewIfNeeded();
    await expect.poll(() => thumbs.first().evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
    await expectAccessible(page);
    expect(errors).toEqual([]);
    await page.close();
  });
});
