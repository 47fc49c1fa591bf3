// Statuses that follow the work, in Chromium at a phone's and a laptop's width:
// - the tenant says "it's got worse" on a closed report: they are told the landlord has been told
//   and the report reopened, and the officer finds it back in the queue, triaged;
// - the officer records an inspection on a new case and its status moves by itself, with no
//   status changed by hand.
// axe-core on every page the journey visits.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { consoleErrors, expectAccessible, signIn, VIEWPORTS, type ViewportName } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient, type Client } from "../support/test-app.js";
import { hoursAgo } from "../support/test-clock.js";

let served: ServedApp;
let browser: Browser;
let tenantApi: Client;
let officerApi: Client;

const report = {
  description: "Mould is growing along the top of the bedroom wall behind the bed.",
  locations: ["external-wall"],
  observations: ["mould-spots"],
};

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  tenantApi = await signedInClient(served.app, "tenant@example.org", DEMO_PASSWORD);
  officerApi = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

/** A new report from the demo tenant, through the API. */
async function newReport(): Promise<{ id: number; reference: string }> {
  return (await tenantApi.post("/api/cases", report).expect(201)).body;
}

async function openPage(viewport: ViewportName): Promise<{ page: Page; errors: string[] }> {
  // Each walk starts signed out (the browser profile is shared by the tests of this file).
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize(VIEWPORTS[viewport]);
  return { page, errors: consoleErrors(page) };
}

describe.each(Object.keys(VIEWPORTS) as ViewportName[])("at %s size", (viewport) => {
  it("a closed report that got worse is reopened and is back in the officer's queue", async () => {
    // The report was inspected (the status followed), then closed by hand with a reason.
    const c = await newReport();
    await officerApi
      .post(`/api/cases/${c.id}/inspections`, {
        inspectedAt: hoursAgo(3).toISOString(),
        cause: "condensation",
        mouldExtent: "under-1-m2",
        findings: "Light mould on the outside wall; the trickle vents were shut.",
        roomReadings: [],
      })
      .expect(201);
    await officerApi
      .patch(`/api/cases/${c.id}`, { status: "closed", reason: "Vents opened with the tenant; no works needed." })
      .expect(200);

    // The tenant says it has got worse.
    const { page, errors } = await openPage(viewport);
    await signIn(page, served.url, "tenant@example.org");
    await page.goto(`${served.url}/cases/${c.id}`);
    await page.getByRole("heading", { level: 1, name: c.reference }).waitFor();
    await expectAccessible(page);
    await page.getByRole("button", { name: "It's got worse" }).click();
    const dialog = page.getByRole("dialog", { name: "Tell your landlord it has got worse" });
    await dialog.getByLabel("What has changed?").fill("The mould is back and now covers the window reveal too.");
    await dialog.getByRole("button", { name: "Send to my landlord" }).click();
    await page.getByText("Thank you, your landlord has been told").waitFor();
    await page.getByText(/Your report has been reopened/).waitFor();
    await expectAccessible(page);

    // The officers were e-mailed with the tenant's words (nobody is assigned).
    await expect
      .poll(() =>
        served.mail.mails.some(
          (m) => m.to.includes("officer@example.org") && m.subject.includes(c.reference) && /window reveal too/.test(m.raw),
        ),
      )
      .toBe(true);

    // The officer finds it in the queue again, triaged.
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.getByRole("heading", { name: "Sign in" }).waitFor();
    await signIn(page, served.url, "officer@example.org");
    await page.goto(`${served.url}/queue?q=${encodeURIComponent(c.reference)}`);
    const table = page.getByRole("table", { name: "Case queue" });
    const link = table.getByRole("link", { name: c.reference });
    await link.waitFor();
    await expect.poll(() => table.locator("tbody tr").first().innerText()).toMatch(/Triaged/);
    await expectAccessible(page);
    // The sign-in page asks who is signed in and is told 401 before anyone is: that is not an error of the journey.
    expect(errors.filter((e) => !/status of 401/.test(e))).toEqual([]);
    await page.close();
  });

  it("recording an inspection moves a new case on by itself", async () => {
    const c = await newReport();
    const { page, errors } = await openPage(viewport);
    await signIn(page, served.url, "officer@example.org");
    await page.goto(`${served.url}/cases/${c.id}?tab=inspection`);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toContain(c.reference);
    const summary = page.getByRole("region", { name: "Case summary" });
    await expect.poll(() => summary.innerText()).toMatch(/Status:\s*New/);
    await expectAccessible(page);

    await page.getByRole("button", { name: "Record an inspection" }).click();

    await page.getByRole("radio", { name: /^Condensation/ }).check();
    await page.getByRole("radio", { name: /^1 to 5 m²/ }).check();
    await page
      .getByRole("textbox", { name: "Findings" })
      .fill("Mould along the top of the outside wall behind the bed; the room is not heated at night.");
    await page.getByRole("button", { name: "Record inspection" }).click();
    await expect
      .poll(async () => (await page.getByText("The deadlines and the timeline now include it.").count()) > 0)
      .toBe(true);

    // No status was changed by hand: the case followed the inspection.
    await expect.poll(() => summary.innerText()).toMatch(/Status:\s*Investigated/);
    const res = await officerApi.get(`/api/cases/${c.id}/events`).expect(200);
    const moves = (res.body.events as { type: string; before: { status: string }; after: { status: string } }[])
      .filter((e) => e.type === "status-changed")
      .map((e) => `${e.before.status}→${e.after.status}`);
    expect(moves).toEqual(["new→triaged", "triaged→investigated"]);
    await expectAccessible(page);
    // The sign-in page asks who is signed in and is told 401 before anyone is: that is not an error of the journey.
    expect(errors.filter((e) => !/status of 401/.test(e))).toEqual([]);
    await page.close();
  });
});
