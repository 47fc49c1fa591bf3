// The officer's journey in Chromium: the queue filtered to overdue cases with a vulnerable
// household, the top case opened, an inspection and an HHSRS assessment recorded, the written
// summary sent, and the tenant reading it on their own case page. An axe-core scan of the queue.
import { AxeBuilder } from "@axe-core/playwright";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { Case } from "../../server/modules/cases/case.entity.js";
import { launchBrowser, type Browser } from "../support/browser.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";
import { msAgo, testClock } from "../support/test-clock.js";

let served: ServedApp;
let browser: Browser;
let caseId: number;
let reference: string;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  // Sam (the second demo tenant) reported black mould in the bedroom three weeks ago, with a
  // reading that condenses: the household has a child and someone with asthma. Nobody has
  // investigated it, so the 10-working-day clock has run out. It is built to outrank every demo
  // case that is also overdue with a vulnerable household (largest area, two groups, condensing).
  const sam = await signedInClient(served.app, "tenant2@example.org", DEMO_PASSWORD);
  const home = (await sam.get("/api/me/home").expect(200)).body.property;
  const bedroom = home.rooms.find((r: { kind: string }) => r.kind === "bedroom");
  const created = await sam
    .post("/api/cases", {
      description: "Black mould has spread across the bedroom's outside wall and the window runs with water every morning.",
      locations: ["external-wall", "window"],
      observations: ["mould-spots", "condensation"],
      area: "larger",
      vulnerability: ["children-under-15", "breathing-or-immune", "pregnancy"],
      roomIds: [bedroom.id],
    })
    .expect(201);
  caseId = created.body.id;
  reference = created.body.reference;
  // Two days of hourly readings from a cheap hygrometer and a surface thermometer: condensing throughout.
  const readings = Array.from({ length: 48 }, (_, h) => ({
    roomId: bedroom.id,
    takenAt: msAgo((48 - h) * 3_600_000).toISOString(),
    airTemperatureC: 18,
    relativeHumidityPct: 82,
    surfaceTemperatureC: 11,
  }));
  await sam.post(`/api/cases/${caseId}/readings`, readings).expect(201);
  // Backdate the awareness by three weeks, as if the report had been sitting there (and mark the
  // figures stale, as any change does).
  await served.ctx.dataSource
    .getRepository(Case)
    .update(caseId, { awareAt: msAgo(21 * 86_400_000), triageDueAt: testClock.now() });
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

async function signIn(page: Page, email: string, heading: string) {
  await page.goto(`${served.url}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(heading);
}

it("triages from the queue to the written summary, and the tenant reads it", async () => {
  const page = await browser.context.newPage();
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, "officer@example.org", "Case queue");
  const table = page.getByRole("table", { name: "Case queue" });
  await table.getByRole("link", { name: /^DW-/ }).first().waitFor();

  // axe-core on the queue with its rows: no serious or critical findings.
  const scan = await new AxeBuilder({ page }).analyze();
  const bad = scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join("; ")})`)).toEqual([]);

  // Filter to overdue cases with a vulnerable household.
  await page.getByLabel("Deadline").selectOption("overdue");
  await page.getByLabel("Vulnerable household").selectOption("true");
  await expect.poll(() => new URL(page.url()).searchParams.get("overdue")).toBe("true");
  await expect.poll(() => new URL(page.url()).searchParams.get("vulnerable")).toBe("true");
  // Every row now says it is overdue, in words.
  await expect
    .poll(async () => (await table.locator("tbody tr").allInnerTexts()).every((row) => /overdue/i.test(row)))
    .toBe(true);

  // Sam's case is at the top, after any emergency past its deadline (the demo has one: an emergency
  // goes first, src/lib/domain/triage-priority.ts).
  const links = table.getByRole("link", { name: /^DW-/ });
  await links.first().waitFor();
  const rows = await table.locator("tbody tr").allInnerTexts();
  const sams = rows.findIndex((row) => row.includes(reference));
  expect(sams).toBeGreaterThanOrEqual(0);
  expect(rows.slice(0, sams).every((row) => /100/.test(row))).toBe(true);
  await table.getByRole("link", { name: reference }).click();
  await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toContain(reference);

  // Record the inspection: condensation, 1–5 m² of mould, a reading in the bedroom.
  await page.getByRole("tab", { name: "Inspection and assessment" }).click();
  await page.getByRole("button", { name: "Record an inspection" }).click();
  await page.getByRole("radio", { name: /^Condensation/ }).check();
  await page.getByRole("radio", { name: /^1 to 5 m²/ }).check();
  await page
    .getByRole("textbox", { name: "Findings" })
    .fill(
      "Mould over the cold outside wall and window reveal; the bathroom extract fan does not run and the trickle vents are painted shut.",
    );
  await page.getByRole("button", { name: "Record inspection" }).click();
  await expect.poll(async () => (await page.getByText("The deadlines and the timeline now include it.").count()) > 0).toBe(true);

  // The HHSRS assessment: likelihood 1 in 32; harm spread over classes II–IV.
  await page.getByRole("button", { name: "New assessment" }).click();
  await page.getByLabel("Likelihood of a harmful occurrence in the next 12 months").selectOption("32");
  await page.getByLabel(/^Class II \(/).fill("21.5");
  await page.getByLabel(/^Class III \(/).fill("46.4");
  await page.getByLabel(/^Class IV \(/).fill("32.1");
  await page
    .getByRole("textbox", { name: "Justification" })
    .fill("Extensive mould in a child's bedroom with a household member who has asthma.");
  await page
    .getByRole("button", { name: /assessment/i })
    .first()
    .click();
  await expect.poll(async () => (await page.getByText(/Assessment version 1 saved/).count()) > 0).toBe(true);

  // The written summary: the draft is prefilled from the inspection; the officer writes the work.
  await page.getByRole("tab", { name: "Letters and messages" }).click();
  await page.getByRole("button", { name: "Write the written summary" }).click();
  const summary = page.getByLabel("Summary for the tenant");
  await expect.poll(() => summary.inputValue()).toContain("We inspected your home");
  const draft = await summary.inputValue();
  await summary.fill(
    draft
      .replace(
        /\[Fill in: the work we will do, room by room\]/,
        "We will fit a continuous extract fan in the bathroom, free the trickle vents and treat the mould in the bedroom.",
      )
      .replace(/\[Fill in: [^\]]*\]/g, "We will book the work with you this week."),
  );
  await page.getByRole("button", { name: "Send the written summary" }).click();
  await page.getByRole("button", { name: "Send it" }).click();
  await expect.poll(async () => (await page.getByText(/^Sent at /).count()) > 0).toBe(true);

  // The summary went to Sam by e-mail as well.
  await expect
    .poll(() =>
      served.mail.mails.some((m) => m.to.includes("tenant2@example.org") && /continuous extract fan in the bathroom/.test(m.raw)),
    )
    .toBe(true);

  // Sam signs in and reads the summary on the case page.
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.getByRole("heading", { name: "Sign in" }).waitFor();
  await signIn(page, "tenant2@example.org", "My home");
  await page.goto(`${served.url}/cases/${caseId}`);
  await expect.poll(async () => (await page.getByText(/continuous extract fan in the bathroom/).count()) > 0).toBe(true);
  await page.close();
});
