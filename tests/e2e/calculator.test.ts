// The public calculator in Chromium, signed out: results follow the typing, and axe finds nothing serious.
import { AxeBuilder } from "@axe-core/playwright";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { serveDemoApp, type ServedApp } from "../support/served-app.js";

let served: ServedApp;
let browser: Browser;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

describe("dew point calculator", () => {
  it("updates the result as the values change, signed out", async () => {
    const page = await browser.context.newPage();
    try {
      await page.goto(`${served.url}/calculator`);
      await expect
        .poll(() => page.getByRole("heading", { level: 1 }).textContent())
        .toBe("Dew point and surface humidity calculator");
      const results = page.getByRole("region", { name: "Result" });
      await expect.poll(() => results.getByText("Results appear here as you type").isVisible()).toBe(true);

      await page.getByLabel("Room temperature (°C)").fill("19");
      await page.getByLabel("Relative humidity (%)").fill("78");
      await page.getByLabel(/^Surface temperature/).fill("9");

      await expect.poll(() => results.getByText("Condensing", { exact: true }).isVisible()).toBe(true);
      // Source: Magnus form, Alduchov & Eskridge (1996), by hand: γ = ln 0.78 + 17.625·19/262.04 = 1.02949,
      // Td = 243.04·γ/(17.625 − γ) = 15.08 °C, shown as 15.1 °C.
      const dewPoint = results.locator("dt", { hasText: "Dew point" }).locator("+ dd");
      await expect.poll(() => dewPoint.textContent()).toContain("15.1 °C");

      // A warmer surface: 18 °C gives about 83 % at the surface, at or above ISO 13788's 80 %.
      await page.getByLabel(/^Surface temperature/).fill("18");
      await expect.poll(() => results.getByText("Mould risk", { exact: true }).isVisible()).toBe(true);
      expect(await results.getByText("Condensing", { exact: true }).count()).toBe(0);
      await expect.poll(() => results.getByRole("status").textContent()).toMatch(/Mould risk/);
    } finally {
      await page.close();
    }
  });

  it("has no serious or critical accessibility violations, empty or with a result", async () => {
    const page = await browser.context.newPage();
    try {
      await page.goto(`${served.url}/calculator`);
      await expect
        .poll(() => page.getByRole("heading", { level: 1 }).textContent())
        .toBe("Dew point and surface humidity calculator");
      const serious = async () => {
        const { violations } = await new AxeBuilder({ page }).analyze();
        return violations
          .filter((v) => v.impact === "serious" || v.impact === "critical")
          .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`);
      };
      expect(await serious()).toEqual([]);

      await page.getByRole("button", { name: "Try an example" }).click();
      await page.getByLabel(/^Outdoor temperature/).fill("0");
      await page.getByLabel(/^Building element/).selectOption({ label: "Older double glazing" });
      await expect
        .poll(() => page.getByRole("region", { name: "Result" }).getByText("Condensing", { exact: true }).isVisible())
        .toBe(true);
      expect(await serious()).toEqual([]);

      // An invalid value: the field message and the out-of-date result must pass too.
      await page.getByLabel("Relative humidity (%)").fill("101");
      await expect.poll(() => page.getByText("Relative humidity must be at most 100 %.").isVisible()).toBe(true);
      expect(await serious()).toEqual([]);
    } finally {
      await page.close();
    }
  });
});
