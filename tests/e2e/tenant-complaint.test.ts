// A formal complaint in Chromium, at a phone's width and a laptop's: the tenant makes one from their
// case page, the officers are e-mailed, the officer acknowledges it and extends stage 1 with a reason,
// and the tenant is sent the letters and sees the reason on their case page.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { consoleErrors, expectAccessible, signIn, VIEWPORTS } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";

let served: ServedApp;
let browser: Browser;
const TENANT = "tenant@example.org";
const OFFICER = "officer@example.org";

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

async function newReport(): Promise<{ id: number; reference: string }> {
  const robin = await signedInClient(served.app, TENANT, DEMO_PASSWORD);
  const created = await robin
    .post("/api/cases", {
      description: "Mould keeps coming back on the bedroom ceiling.",
      locations: ["ceiling"],
      observations: ["mould-spots"],
    })
    .expect(201);
  return { id: created.body.id, reference: created.body.reference };
}

async function switchTo(page: Page, errors: string[], email: string) {
  expect(errors).toEqual([]);
  await page.goto("about:blank");
  await page.context().clearCookies();
  await signIn(page, served.url, email);
  errors.length = 0;
}

describe.each(Object.entries(VIEWPORTS))("at the %s size", (size, viewport) => {
  it("takes a complaint from the tenant's words to an extension the tenant is told about", async () => {
    const { id, reference } = await newReport();
    const words = `Nobody came for three weeks after I reported it (${size}).`;
    const reason = `We are waiting for the roofer's report (${size}).`;
    const page = await browser.context.newPage();
    onTestFinished(() => page.close());
    const errors = consoleErrors(page);
    await page.setViewportSize(viewport);

    // The tenant makes a complaint from the case page.
    await switchTo(page, errors, TENANT);
    await page.goto(`${served.url}/cases/${id}#case-complaint`);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(reference);
    const mine = page.getByRole("region", { name: "Complaint" });
    await mine.getByLabel("What are you unhappy about?").fill(words);
    await mine.getByRole("button", { name: "Make a complaint" }).click();
    await mine.getByText("Stage 1: waiting for acknowledgement").waitFor();
    await expectAccessible(page);
    await expect.poll(async () => (await served.mail.lastTo(OFFICER, 20_000)).subject).toMatch(/^Formal complaint about /);

    // The officer acknowledges it and extends stage 1 with a reason.
    await switchTo(page, errors, OFFICER);
    await page.goto(`${served.url}/cases/${id}`);
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(reference);
    const panel = page.getByRole("region", { name: "Complaint" });
    await panel.getByText(words).waitFor();
    await panel.getByRole("button", { name: "Acknowledge stage 1 and send the letter" }).click();
    await panel.getByText("Stage 1: acknowledged, response due").waitFor();
    await expectAccessible(page);
    await expect.poll(async () => (await served.mail.lastTo(TENANT, 20_000)).subject).toMatch(/received your complaint/);
    await panel.getByRole("button", { name: "Extend stage 1 (once)" }).click();
    await panel.getByLabel("Extra working days").fill("5");
    await panel.getByLabel("The reason (the tenant is sent it)").fill(reason);
    await panel.getByRole("button", { name: "Extend and tell the tenant" }).click();
    await panel.getByText(`Extended by 5 working days: ${reason}`).waitFor();
    await expect.poll(async () => (await served.mail.lastTo(TENANT, 20_000)).raw).toContain(reason);

    // The tenant sees the reason on their case page.
    await switchTo(page, errors, TENANT);
    await page.goto(`${served.url}/cases/${id}#case-complaint`);
    await page.getByRole("region", { name: "Complaint" }).getByText(`Extended by 5 working days: ${reason}`).waitFor();
    await expectAccessible(page);
    expect(errors).toEqual([]);
  });
});
