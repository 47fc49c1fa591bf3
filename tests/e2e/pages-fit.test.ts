// Pages that fit a screen: the officers' queue at 1 280 px without sideways scrolling and with at
// least 15 rows above the fold at 1 440 × 900; the staff workspace as a summary and tabs; the
// tenant's case page short on a phone, leading with what happens next. Measured in Chromium.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { expectAccessible, horizontalOverflow, signIn, VIEWPORTS, type ViewportName } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

let served: ServedApp;
let browser: Browser;
/** Robin's report, with a week of readings and two messages from the officer: a full page on both sides. */
let tenantCaseId: number;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  const robin = await signedInClient(served.app, "tenant@example.org", DEMO_PASSWORD);
  const home = (await robin.get("/api/me/home").expect(200)).body.property;
  const room = home.rooms[0];
  const created = await robin
    .post("/api/cases", {
      description: "Mould is spreading on the bedroom wall behind the bed, and the window runs with water every morning.",
      locations: ["external-wall", "window"],
      observations: ["mould-spots", "condensation"],
      area: "a4",
      roomIds: [room.id],
    })
    .expect(201);
  tenantCaseId = created.body.id;
  // A week of hourly readings with a two-day pause in the middle, so the page has a full chart and table.
  const readings = Array.from({ length: 7 * 24 }, (_, h) => h)
    .filter((h) => h < 60 || h >= 108)
    .map((h) => ({
      roomId: room.id,
      takenAt: msAgo((7 * 24 - h) * 3_600_000).toISOString(),
      airTemperatureC: 18 + (h % 24) / 12,
      relativeHumidityPct: 70 + (h % 12),
      surfaceTemperatureC: 12,
    }));
  await robin.post(`/api/cases/${tenantCaseId}/readings`, readings).expect(201);
  const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
  for (const body of [
    "Thank you for your report. We will call you this week to arrange a visit.",
    "We can visit on Tuesday morning. Please leave the bedroom window closed the night before.",
  ])
    await officer.post(`/api/cases/${tenantCaseId}/messages`, { body, internal: false }).expect(201);
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

const pageHeight = (page: Page) => page.evaluate(() => document.documentElement.scrollHeight);

/** A page signed out (each test signs in as its own person). */
async function newPage(viewport: { width: number; height: number }) {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize(viewport);
  return page;
}

describe("the officers' queue", () => {
  it("fits 1 280 px without sideways scrolling, with the six default columns in view", async () => {
    const page = await newPage({ width: 1280, height: 900 });
    await signIn(page, served.url, "officer@example.org");
    const table = page.getByRole("table", { name: "Case queue" });
    await table.getByRole("link", { name: /^DW-/ }).first().waitFor();

    const box = table.locator("xpath=..");
    const { scrollWidth, clientWidth } = await box.evaluate((el) => ({
      scrollWidth: el.scrollWidth,
      clientWidth: el.clientWidth,
    }));
    expect(scrollWidth).toBeLessThanOrEqual(clientWidth);
    expect(await horizontalOverflow(page)).toBe(0);

    // The six default columns, each heading inside the visible width of the box.
    const headings = ["Priority", "Reference", "Home", "Risk state", "Next deadline", "Status"];
    const boxRight = await box.evaluate((el) => el.getBoundingClientRect().right);
    for (const name of headings) {
      const header = table.getByRole("columnheader", { name: new RegExp(`^${name}`) });
      const rect = (await header.boundingBox())!;
      expect({ name, inside: rect.x + rect.width <= boxRight + 1 }).toEqual({ name, inside: true });
    }
    // The others wait behind the column menu.
    expect(await table.getByRole("columnheader", { name: /^Channel/ }).count()).toBe(0);
    await expectAccessible(page);
    await page.close();
  });

  it("shows at least 15 whole rows above the fold at 1 440 × 900", async () => {
    const page = await newPage(VIEWPORTS.desktop);
    await signIn(page, served.url, "officer@example.org");
    const table = page.getByRole("table", { name: "Case queue" });
    await table.getByRole("link", { name: /^DW-/ }).first().waitFor();
    const above = await table
      .locator("tbody tr")
      .evaluateAll((rows) => rows.filter((r) => r.getBoundingClientRect().bottom <= window.innerHeight).length);
    expect(above).toBeGreaterThanOrEqual(15);
    await page.close();
  });
});

describe.each(Object.keys(VIEWPORTS) as ViewportName[])("at the %s size", (size) => {
  it("the staff workspace is a summary and tabs, each section one step away", async () => {
    const page = await newPage(VIEWPORTS[size]);
    await signIn(page, served.url, "officer@example.org");
    await page.goto(`${served.url}/cases/${tenantCaseId}`);
    await page.getByRole("heading", { level: 1 }).waitFor();
    const summary = page.getByRole("region", { name: "Case summary" });
    for (const term of ["Status", "Priority", "Next deadline", "Assigned to", "Risk"])
      await summary.getByText(term, { exact: true }).waitFor();
    const tabs = page.getByRole("tablist", { name: "Parts of the case" });
    await tabs.waitFor();
    const height = await pageHeight(page);
    // One long page before: 17 865 and 11 763 px. The overview holds the tenant's answers as cards.
    expect(height).toBeLessThan(size === "phone" ? 5000 : 3500);
    expect(await horizontalOverflow(page)).toBe(0);
    await expectAccessible(page);

    for (const [tab, heading] of [
      ["Readings", "Readings"],
      ["Inspection and assessment", "Inspections"],
      ["Letters and messages", "Written summary"],
      ["Works", "Works"],
      ["Timeline", "Timeline"],
    ] as const) {
      await tabs.getByRole("tab", { name: tab }).click();
      await page.getByRole("tabpanel", { name: tab }).getByRole("heading", { name: heading, exact: true }).waitFor();
      expect(await horizontalOverflow(page)).toBe(0);
      await expectAccessible(page);
    }
    // A form opens on demand, and Cancel closes it.
    await tabs.getByRole("tab", { name: "Inspection and assessment" }).click();
    await page.getByRole("button", { name: "Record an inspection" }).click();
    await page.getByRole("textbox", { name: "Findings" }).waitFor();
    await page.getByRole("button", { name: "Cancel" }).click();
    await page.getByRole("textbox", { name: "Findings" }).waitFor({ state: "detached" });
    await page.close();
  });

  it("the tenant's case page leads with what happens next and stays short", async () => {
    const page = await newPage(VIEWPORTS[size]);
    await signIn(page, served.url, "tenant@example.org");
    await page.goto(`${served.url}/cases/${tenantCaseId}`);
    await page.getByRole("heading", { name: "What happens next" }).waitFor();
    const height = await pageHeight(page);
    expect(height).toBeLessThan(size === "phone" ? 2500 : 2000); // before: 9 357 and 7 351 px
    expect(await horizontalOverflow(page)).toBe(0);
    await expectAccessible(page);

    // Every other part is one press away, under a clear heading.
    for (const name of ["What your readings show", "Readings", "Photos", "What has happened so far", "What you told us"]) {
      const opener = page.getByRole("button", { name, exact: true });
      await opener.click();
      await expect.poll(() => opener.getAttribute("aria-expanded")).toBe("true");
    }
    // The chart has room on a phone.
    const chart = page.locator("canvas").first();
    await chart.waitFor();
    expect((await chart.boundingBox())!.height).toBeGreaterThanOrEqual(200);
    expect(await horizontalOverflow(page)).toBe(0);
    await expectAccessible(page);
    await page.close();
  });
});
