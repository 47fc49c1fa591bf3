// The compliance dashboard in Chromium on the demo data: an officer opens it from the navigation, finds
// the estate with most cases per 100 homes and the stage most often missed, narrows it to that estate
// (the filter goes into the URL and survives a reload), opens a chart's table, and axe-core finds nothing
// serious, at a phone's and a laptop's width. A tenant is told the page is not for them.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { consoleErrors, expectAccessible, horizontalOverflow, signIn, VIEWPORTS, type ViewportName } from "../support/journey.js";
import { serveDemoApp, type ServedApp } from "../support/served-app.js";

let served: ServedApp;
let browser: Browser;

beforeAll(async () => {
  served = await serveDemoApp();
  // Work out every demo case's stored figures (and clocks) now, as the background sweep would.
  while ((await served.ctx.services.triage.refreshStale(undefined, 500)) > 0);
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

describe.each(Object.keys(VIEWPORTS) as ViewportName[])("at %s size", (size) => {
  it("an officer finds the top estate and the most-missed stage, filters by estate and reads a chart's table", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.setViewportSize(VIEWPORTS[size]);
    await signIn(page, served.url, "officer@example.org");
    const errors = consoleErrors(page);
    await page.getByRole("heading", { level: 1, name: "Case queue" }).waitFor();
    await page.getByRole("link", { name: "Dashboard" }).click();
    await page.getByRole("heading", { level: 1, name: "Dashboard" }).waitFor();
    await page.getByRole("heading", { name: "At a glance" }).waitFor();

    const glance = page.locator("#glance");
    const topEstate = (await glance.locator("dt:has-text('Estate with most cases per 100 homes') + dd").innerText()).trim();
    expect(topEstate).toMatch(/\(\d+(\.\d)?\)$/);
    await expect.poll(() => glance.locator("dt:has-text('Stage most often missed') + dd").innerText()).not.toBe("");
    await page.getByRole("table", { name: "Deadline stages met, missed and open" }).waitFor();
    await page.getByRole("table", { name: "Cases per 100 homes" }).waitFor();
    await expectAccessible(page);

    // The top estate, as the hotspot table's first estate row says.
    const estate = topEstate.replace(/ \([^)]*\)$/, "");
    await page.getByLabel("Estate", { exact: true }).selectOption(estate);
    await expect.poll(() => new URL(page.url()).searchParams.get("estate")).toBe(estate);
    await page.getByText(`on ${estate}; the open cases`).waitFor();
    await page.reload();
    await page.getByText(`on ${estate}; the open cases`).waitFor();
    expect(await page.getByLabel("Estate", { exact: true }).inputValue()).toBe(estate);

    await page.getByText("Cases by month (table)").click();
    await page.getByRole("table", { name: "Cases by month reported" }).waitFor();
    const exportLink = page.getByRole("group", { name: "Export cases by month reported" }).getByRole("link", { name: /CSV/ });
    expect(await exportLink.getAttribute("href")).toContain(`table=seasonal`);
    expect(await exportLink.getAttribute("href")).toContain(`estate=${encodeURIComponent(estate).replace(/%20/g, "+")}`);
    await expectAccessible(page);
    expect(await horizontalOverflow(page)).toBe(0);
    expect(errors).toEqual([]);
    await page.close();
  });
});

it("a tenant is not shown the dashboard", async () => {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await signIn(page, served.url, "tenant@example.org");
  await page.goto(`${served.url}/dashboard`);
  await page.getByRole("heading", { level: 1, name: "Not allowed" }).waitFor();
  expect(await page.getByRole("heading", { level: 1, name: "Dashboard" }).count()).toBe(0);
  await page.close();
});
