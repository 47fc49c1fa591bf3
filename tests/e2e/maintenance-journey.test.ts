// The maintenance lead's day in Chromium, at 390 px and at 1440 px: a free half-day on the week board
// books a work order into it (the schedule dialog opens filled in), the tenant gets an e-mail with
// the visit and a calendar file but never the operative's description, and the completion is recorded
// with the day the work was actually done (before the booked day, so with a reason). axe-core on every
// page the journey visits, the tenant's case page included.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { WorkOrder } from "../../server/modules/works/work-order.entity.js";
import { localDate } from "../../src/lib/domain/working-days.js";
import { launchBrowser, type Browser } from "../support/browser.js";
import { consoleErrors, expectAccessible, signIn, VIEWPORTS, type ViewportName } from "../support/journey.js";
import { outboxRows } from "../support/outbox.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";
import { msAgo, testClock, workingDaysAhead } from "../support/test-clock.js";

let served: ServedApp;
let browser: Browser;
const HOUR = 3_600_000;
/** One far-off working day per screen size, clear of the demo's bookings and of each other. */
const [phoneDay, desktopDay] = workingDaysAhead(35, 2) as [string, string];
const DAYS: Record<ViewportName, string> = { phone: phoneDay, desktop: desktopDay };

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

/** Sam's investigated case with an extractor-fan order whose description is for the operative only. */
async function orderToBook(secret: string): Promise<{ caseId: number; reference: string; orderId: number }> {
  const sam = await signedInClient(served.app, "tenant2@example.org", DEMO_PASSWORD);
  const home = (await sam.get("/api/me/home").expect(200)).body.property;
  const bathroomId = home.rooms.find((r: { kind: string }) => r.kind === "bathroom").id;
  const created = (
    await sam
      .post("/api/cases", {
        description: "Black mould on the bathroom ceiling; the fan makes no noise any more.",
        locations: ["ceiling"],
        observations: ["mould-spots", "condensation"],
        roomIds: [bathroomId],
      })
      .expect(201)
  ).body;
  const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
  await officer
    .patch(`/api/cases/${created.id}`, { status: "triaged", hazardClass: "significant", reason: "The extract fan has failed." })
    .expect(200);
  await officer
    .post(`/api/cases/${created.id}/inspections`, {
      inspectedAt: msAgo(2 * HOUR).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "The bathroom extract fan has failed; condensation mould on the ceiling above the bath.",
      roomReadings: [],
    })
    .expect(201);
  const order = (
    await officer
      .post(`/api/cases/${created.id}/work-orders`, { type: "extractor-fan", description: secret, roomIds: [bathroomId] })
      .expect(201)
  ).body;
  return { caseId: created.id, reference: created.reference, orderId: order.id };
}

const mondayOf = (date: string) => {
  const d = new Date(`${date}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() - ((d.getUTCDay() + 6) % 7));
  return d.toISOString().slice(0, 10);
};
const weekdayWords = (date: string) =>
  new Date(`${date}T12:00:00Z`).toLocaleDateString("en-GB", { weekday: "long", day: "numeric", month: "long", timeZone: "UTC" });

async function signOut(page: Page) {
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.getByRole("heading", { name: "Sign in" }).waitFor();
}

describe.each(Object.keys(VIEWPORTS) as ViewportName[])("at the %s size", (size) => {
  it("books a visit from a free slot, tells the tenant without the operative's notes, and records the real work date", async () => {
    const secret = `Operative only (${size}): the loft hatch sticks, bring the long ladder and a 100 mm duct.`;
    const { caseId, reference, orderId } = await orderToBook(secret);
    const day = DAYS[size];
    // Each size starts signed out (the pages share one browser context).
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    const errors = consoleErrors(page);
    await page.setViewportSize(VIEWPORTS[size]);

    // The lead opens the week of the visit and clicks Dale's free morning.
    await signIn(page, served.url, "maintenance@example.org");
    await page.goto(`${served.url}/works?week=${mondayOf(day)}`);
    await page.getByRole("table", { name: /Bookings for the week of/ }).waitFor();
    await expectAccessible(page);
    const free = page.getByRole("button", { name: `Free: book Dale Whitcombe, ${weekdayWords(day)}, Morning 8–12` });
    await free.focus();
    await page.keyboard.press("Enter");
    const picker = page.getByRole("dialog", { name: "Book this free slot" });
    await picker
      .getByText(/Dale Whitcombe/)
      .first()
      .waitFor();
    await expectAccessible(page);
    await picker.getByRole("radio", { name: new RegExp(`^${reference}: `) }).check();
    await picker.getByRole("button", { name: "Continue" }).click();

    // The schedule dialog opens with Dale, the day and the morning filled in.
    const dialog = page.getByRole("dialog", { name: `Schedule ${reference}` });
    await dialog.waitFor();
    expect(await dialog.getByLabel("Operative", { exact: true }).locator("option:checked").textContent()).toBe("Dale Whitcombe");
    expect(await dialog.getByLabel("Day of the visit", { exact: true }).inputValue()).toBe(day);
    expect(await dialog.getByRole("radio", { name: /^Morning/ }).isChecked()).toBe(true);
    await expectAccessible(page);
    await dialog.getByRole("button", { name: "Book the visit" }).click();
    await dialog.waitFor({ state: "hidden" });
    await page.getByText(`${reference} is booked`).waitFor();
    await page
      .getByRole("table", { name: /Bookings for the week of/ })
      .getByRole("link", { name: reference })
      .waitFor();

    // The tenant is told: an e-mail with the visit and a calendar file, without the operative's description.
    const rows = await outboxRows(served.ctx.dataSource, { to: "tenant2@example.org", template: "appointmentProposed", caseId });
    expect(rows).toHaveLength(1);
    const mail = await served.mail.lastTo("tenant2@example.org");
    expect(mail.subject).toMatch(/^Proposed appointment/);
    expect(mail.raw).toContain(reference);
    expect(mail.raw).toMatch(/BEGIN:VCALENDAR/);
    expect(mail.raw.replace(/\r?\n[ \t]/g, "")).not.toContain("long ladder");
    await signOut(page);

    // Sam reads the case page: the visit, never the operative's description.
    await signIn(page, served.url, "tenant2@example.org");
    await page.goto(`${served.url}/cases/${caseId}`);
    await page.getByRole("button", { name: "Confirm this appointment" }).waitFor();
    expect(await page.locator("body").innerText()).not.toContain("long ladder");
    await expectAccessible(page);
    await signOut(page);

    // The work was done today, ahead of the booking (a cancellation freed Dale): the day and the reason are recorded.
    await signIn(page, served.url, "maintenance@example.org");
    await page.goto(`${served.url}/cases/${caseId}?tab=works`);
    const works = page.locator("#case-works");
    const item = works.getByRole("listitem").filter({ has: page.getByRole("heading", { name: "Extractor fan: fit or repair" }) });
    await item.getByRole("button", { name: /^Record completion…/ }).click();
    const complete = page.getByRole("dialog", { name: /^Record completion/ });
    const today = localDate(testClock.now());
    await complete.getByLabel("Day the work was done").fill(today);
    await complete
      .getByRole("textbox", { name: /What was done/ })
      .fill("Fitted a continuous extract fan with humidity boost; tested.");
    await complete.getByRole("button", { name: "Record completion" }).click();
    const reason = complete.getByRole("textbox", { name: "Why was it done before the booked day?" });
    await expect.poll(() => reason.evaluate((el) => el === document.activeElement)).toBe(true);
    await expectAccessible(page);
    await reason.fill("A cancellation freed Dale this morning and Sam was at home.");
    await complete.getByRole("button", { name: "Record completion" }).click();
    await complete.waitFor({ state: "hidden" });
    await item.getByText(/Completion recorded/).waitFor();
    await expectAccessible(page);
    const stored = await served.ctx.dataSource.getRepository(WorkOrder).findOneByOrFail({ id: orderId });
    expect(stored).toMatchObject({
      status: "done",
      doneOn: today,
      earlyReason: expect.stringMatching(/cancellation freed Dale/),
    });

    // Signed out, the sign-in page asks who is signed in and is told 401: the app's normal answer, not a fault.
    expect(errors.filter((e) => !/status of 401/.test(e))).toEqual([]);
    await page.close();
  });
});
