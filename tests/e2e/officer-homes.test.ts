// Homes and reports taken by staff, in Chromium at a phone's and a laptop's width: an officer logs a
// report that came in by phone, finds it in the queue, opens its home from there and sees the case on
// the home's page; an admin opens a home from the Homes list and edits its details. axe-core on every
// page the journey visits.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { londonLocalInput } from "../../src/lib/dates.js";
import { launchBrowser, type Browser } from "../support/browser.js";
import { expectAccessible, signIn, VIEWPORTS, type ViewportName } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";
import { hoursAgo } from "../support/test-clock.js";

interface Home {
  id: number;
  addressLine1: string;
  postcode: string;
  glazingType: string;
}

let served: ServedApp;
let browser: Browser;
/** A Kestrel Rise home with a current tenant for each screen size, so the two walks do not meet. */
const homes = {} as Record<ViewportName, { home: Home; tenant: string }>;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
  const list: Home[] = (await officer.get("/api/properties?q=Kestrel&pageSize=100").expect(200)).body.items;
  const withTenant: { home: Home; tenant: string }[] = [];
  for (const home of list.slice(5)) {
    const tenants = (await officer.get(`/api/properties/${home.id}/tenants`).expect(200)).body.tenants;
    const current = tenants.find((t: { current: boolean }) => t.current);
    if (current) withTenant.push({ home, tenant: current.name });
    if (withTenant.length === 2) break;
  }
  homes.phone = withTenant[0]!;
  homes.desktop = withTenant[1]!;
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

describe.each(Object.keys(VIEWPORTS) as ViewportName[])("at %s size", (size) => {
  it("an officer logs a phone report, opens its home from the queue and sees the case there", async () => {
    const { home, tenant } = homes[size];
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.setViewportSize(VIEWPORTS[size]);
    await signIn(page, served.url, "officer@example.org");
    await page.getByRole("heading", { level: 1, name: "Case queue" }).waitFor();

    await page.getByRole("link", { name: "Log a report" }).click();
    await page.getByRole("heading", { level: 1, name: "Log a report" }).waitFor();
    await expectAccessible(page);

    // Sending with nothing filled in names what is missing, and logs nothing.
    await page.getByRole("button", { name: "Log the report" }).click();
    await page.getByText("Choose the home the report is about.").waitFor();
    await page.getByText("Tell us in a few words what you see.").waitFor();
    expect(new URL(page.url()).pathname).toBe("/log-report");

    await page.getByLabel("Find a home").fill(home.postcode);
    const chooser = page.getByLabel("Choose the home");
    await chooser.locator(`option[value="${home.id}"]`).waitFor({ state: "attached" });
    await chooser.selectOption(String(home.id));
    const tenantSelect = page.getByLabel(/^Tenant/);
    await tenantSelect.locator("option", { hasText: tenant }).waitFor({ state: "attached" });
    await tenantSelect.selectOption({ label: tenant });
    await page.getByLabel("How the report came in").selectOption("phone");
    const awareAt = hoursAgo(5);
    await page.getByLabel("When the landlord became aware").fill(londonLocalInput(awareAt));
    await page.getByLabel("What was described").fill("Caller says black spots are spreading on the bathroom ceiling.");
    await page.getByRole("checkbox", { name: "Ceiling", exact: true }).check();
    await page.getByRole("checkbox", { name: "Black, green or grey spots (mould)" }).check();
    await page.getByRole("checkbox", { name: "Bathroom", exact: true }).check();
    await page.getByRole("button", { name: "Log the report" }).click();

    // The new case's workspace opens.
    await expect.poll(() => new URL(page.url()).pathname).toMatch(/^\/cases\/\d+$/);
    const caseId = Number(new URL(page.url()).pathname.split("/").pop());
    const heading = page.getByRole("heading", { level: 1, name: /^DW-\d{4}-\d{5}$/ });
    await heading.waitFor();
    const reference = (await heading.textContent())!;
    const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
    const saved = (await officer.get(`/api/cases/${caseId}`).expect(200)).body;
    expect(saved).toMatchObject({ channel: "phone", property: { id: home.id } });
    // To the minute, as the form takes it.
    expect(Math.abs(new Date(saved.awareAt).getTime() - awareAt.getTime())).toBeLessThan(60_000);
    expect(saved.rooms.map((r: { name: string }) => r.name)).toEqual(["Bathroom"]);

    // The queue finds it, and its home cell opens the home's page.
    await page.goto(`${served.url}/queue?q=${encodeURIComponent(reference)}`);
    const table = page.getByRole("table", { name: "Case queue" });
    await table.getByRole("link", { name: reference }).waitFor();
    await table.getByRole("link", { name: home.addressLine1 }).click();
    await page.getByRole("heading", { level: 1, name: new RegExp(`^${home.addressLine1}`) }).waitFor();
    expect(new URL(page.url()).pathname).toBe(`/homes/${home.id}`);
    const cases = page.getByRole("region", { name: "Cases" });
    await cases.getByRole("link", { name: reference }).waitFor();
    await expect.poll(() => cases.textContent()).toContain("Phone call");
    await page.getByRole("region", { name: "Tenants" }).getByText(tenant).waitFor();
    await expectAccessible(page);

    // The case's own link from the home goes back to its workspace.
    await cases.getByRole("link", { name: reference }).click();
    await page.getByRole("heading", { level: 1, name: reference }).waitFor();
    await page.close();
  });

  it("an admin opens a home from the Homes list and edits its details", async () => {
    const { home } = homes[size];
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.setViewportSize(VIEWPORTS[size]);
    await signIn(page, served.url, "admin@example.org");
    await page.goto(`${served.url}/homes?q=${encodeURIComponent(home.postcode)}`);
    await page.getByRole("heading", { level: 1, name: "Homes" }).waitFor();
    const row = page.getByRole("row", { name: new RegExp(home.postcode) });
    await row.waitFor();
    await expectAccessible(page);
    // A click on the row, away from the link, opens the home.
    await row.getByText(home.postcode).click();
    await expect.poll(() => new URL(page.url()).pathname).toBe(`/homes/${home.id}`);
    await page.getByRole("heading", { level: 1, name: new RegExp(`^${home.addressLine1}`) }).waitFor();

    await page.getByRole("button", { name: "Edit details" }).click();
    const uprn = page.getByLabel(/^UPRN/);
    await uprn.fill("12345678901234");
    await page.getByLabel("Glazing").selectOption({ label: "Triple glazing" });
    await page.getByRole("button", { name: "Save the changes" }).click();
    await page.getByText("A UPRN is a number of up to 12 digits.").waitFor();
    await expectAccessible(page);
    const uprnValue = String(880000000000 + home.id);
    await uprn.fill(uprnValue);
    await page.getByRole("button", { name: "Save the changes" }).click();
    await page.getByText("The home's details were saved.").waitFor();
    const details = page.getByRole("region", { name: "Details" });
    await details.getByText("Triple glazing").waitFor();
    await details.getByText(uprnValue).waitFor();

    const admin = await signedInClient(served.app, "admin@example.org", DEMO_PASSWORD);
    expect((await admin.get(`/api/properties/${home.id}`).expect(200)).body).toMatchObject({
      glazingType: "triple",
      uprn: uprnValue,
    });
    await expectAccessible(page);
    await page.close();
  });
});
