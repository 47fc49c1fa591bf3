// The conversation in Chromium, at a phone's width and a laptop's: the tenant writes to the landlord
// with a photo, the officer sees the message as new and replies, the tenant finds the reply from
// their list of reports, and the officer sees that it was read. An e-mail reaches each side.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { jpegWithGps } from "../support/images.js";
import { consoleErrors, expectAccessible, signIn, VIEWPORTS } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";

let served: ServedApp;
let browser: Browser;
const scratch = mkdtempSync(path.join(tmpdir(), "dewline-e2e-"));
const TENANT = "tenant@example.org";
const OFFICER = "officer@example.org";

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
  rmSync(scratch, { recursive: true, force: true });
});

/** A fresh report by the demo tenant, so each screen size starts with an empty conversation. */
async function newReport(): Promise<{ id: number; reference: string }> {
  const robin = await signedInClient(served.app, TENANT, DEMO_PASSWORD);
  const created = await robin
    .post("/api/cases", {
      description: "Grey mould is growing around the bathroom window frame.",
      locations: ["window"],
      observations: ["mould-spots"],
    })
    .expect(201);
  return { id: created.body.id, reference: created.body.reference };
}

const messagesRegion = (page: Page, name: string) => page.getByRole("region", { name });

/** Signs out (the browser forgets its cookies) and in as someone else; console errors are checked per person. */
async function switchTo(page: Page, errors: string[], email: string) {
  // The sign-in page asks who is signed in, and a 401 is the answer it expects: not an error of the journey.
  expect(errors).toEqual([]);
  // Leave the app first: a reply still in flight would set the rolling session cookie again.
  await page.goto("about:blank");
  await page.context().clearCookies();
  await signIn(page, served.url, email);
  errors.length = 0;
}

describe.each(Object.entries(VIEWPORTS))("at the %s size", (size, viewport) => {
  it("carries messages both ways, with e-mails, unread counts and a read receipt", async () => {
    const { id, reference } = await newReport();
    const photo = path.join(scratch, `sill-${size}.jpg`);
    writeFileSync(photo, await jpegWithGps(1200, 900, size.length));
    const tenantWords = `The mould came back on the sill this week (${size}).`;
    const officerWords = `Thank you. A surveyor will call on Thursday morning (${size}).`;

    // One page per screen size, closed whatever happens: the browser's cookies are shared by its pages.
    const page = await browser.context.newPage();
    onTestFinished(() => page.close());
    const errors = consoleErrors(page);
    await page.setViewportSize(viewport);

    // The tenant writes to the landlord, with a photo.
    await switchTo(page, errors, TENANT);
    await page.goto(`${served.url}/cases/${id}#case-messages`);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(reference);
    const tenantPanel = messagesRegion(page, "Messages with your landlord");
    await tenantPanel.getByText("No messages yet").waitFor();
    await expectAccessible(page);
    await tenantPanel.getByRole("button", { name: "Send to your landlord" }).click();
    await tenantPanel.getByText("Write the message.").waitFor();
    await tenantPanel.getByLabel("Write to your landlord").fill(tenantWords);
    await tenantPanel.getByLabel(/^Photos/).setInputFiles(photo);
    await tenantPanel.getByRole("button", { name: "Send to your landlord" }).click();
    await tenantPanel.getByText(/Message sent with 1 photo/).waitFor();
    const mine = tenantPanel.getByRole("article").filter({ hasText: tenantWords });
    await mine.getByRole("img").waitFor();
    await expect
      .poll(() =>
        mine.getByRole("img").evaluate((img) => (img as HTMLImageElement).complete && (img as HTMLImageElement).naturalWidth),
      )
      .toBeGreaterThan(0);
    await expectAccessible(page);

    // Nobody is assigned to the new report, so the officers are e-mailed.
    const toOfficer = await served.mail.lastTo(OFFICER, 20_000);
    expect(toOfficer.subject).toBe(`New message from the tenant on ${reference}`);
    expect(toOfficer.raw).toContain(tenantWords);
    expect(toOfficer.raw).toContain(`/cases/${id}`);

    // The officer sees it as new on the case, and replies to the tenant.
    await switchTo(page, errors, OFFICER);
    await page.goto(`${served.url}/cases/${id}?tab=letters`);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(reference);
    const staffPanel = messagesRegion(page, "Messages and notes");
    await staffPanel.getByText("1 new message from the tenant since you last looked.").waitFor();
    const fromTenant = staffPanel.getByRole("article").filter({ hasText: tenantWords });
    await fromTenant.getByText("New", { exact: true }).waitFor();
    await fromTenant.getByText("Robin Ashdown (tenant)").waitFor();
    await expectAccessible(page);
    await staffPanel.getByRole("radio", { name: /^The tenant/ }).check();
    await staffPanel.getByLabel("Message", { exact: true }).fill(officerWords);
    await staffPanel.getByRole("button", { name: "Send to the tenant" }).click();
    await staffPanel.getByText(/Message sent to the tenant/).waitFor();
    const reply = staffPanel.getByRole("article").filter({ hasText: officerWords });
    await reply.getByText("Not read by the tenant yet").waitFor();

    const toTenant = await served.mail.lastTo(TENANT, 20_000);
    expect(toTenant.raw).toContain(officerWords);
    expect(toTenant.raw).toContain(`/cases/${id}`);

    // The tenant finds the reply from their list of reports.
    await switchTo(page, errors, TENANT);
    await page.goto(`${served.url}/cases`);
    const notice = page.getByRole("region", { name: /Your landlord has written to you/ });
    await notice.getByRole("link", { name: `Report ${reference}` }).waitFor();
    await expectAccessible(page);
    await notice.getByRole("link", { name: `Report ${reference}` }).click();
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(reference);
    const back = messagesRegion(page, "Messages with your landlord");
    await back.getByText("1 new message from your landlord since you last looked.").waitFor();
    await back.getByRole("article").filter({ hasText: officerWords }).getByText("Priya Venn, Housing officer").waitFor();
    // Opening the conversation marked it read: the list no longer lists the report.
    await expect
      .poll(async () => {
        const res = await page.request.get(`${served.url}/api/me/unread-messages`);
        return ((await res.json()) as { items: { caseId: number }[] }).items.map((i) => i.caseId);
      })
      .not.toContain(id);

    // The officer sees that the tenant has read the reply.
    await switchTo(page, errors, OFFICER);
    await page.goto(`${served.url}/cases/${id}?tab=letters`);
    await messagesRegion(page, "Messages and notes")
      .getByRole("article")
      .filter({ hasText: officerWords })
      .getByText(/Read by the tenant \d/)
      .waitFor();

    expect(errors).toEqual([]);
  });
});
