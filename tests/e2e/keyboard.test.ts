// Keyboard only (WCAG 2.1.1, 2.4.3, 2.4.7) and form errors (3.3.1, 4.1.3), in Chromium with no mouse
// click: each journey moves with Tab, Shift+Tab, Enter, Space, arrow keys and typing. After every key,
// focus is on an element with a visible ring (an outline or a box-shadow) and never dropped to <body>
// (a page load's own focus-on-navigate puts it on the heading). Submitting an empty required form shows
// an error that the control names (aria-invalid, aria-describedby) and that is announced (an alert or a
// live region).
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { AxeBuilder } from "@axe-core/playwright";
import type { Locator, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { jpegWithGps } from "../support/images.js";
import { VIEWPORTS } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";
import { msAgo, workingDaysAhead } from "../support/test-clock.js";

let served: ServedApp;
let browser: Browser;
const scratch = mkdtempSync(path.join(tmpdir(), "dewline-a11y-keys-"));
const HOUR = 3_600_000;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
  rmSync(scratch, { recursive: true, force: true });
});

async function newPage(): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize(VIEWPORTS.desktop);
  return page;
}

/**
 * What has focus, and whether its ring shows: "body" when focus was dropped. A control whose ring is
 * drawn on its label counts as shown; so does a heading the page moved focus to (tabindex -1, a place
 * to start reading from, not a control).
 */
function focusState(page: Page): Promise<{ on: string; visible: boolean }> {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { on: "body", visible: false };
    const ring = (x: Element | null) => {
      if (!x) return false;
      const s = getComputedStyle(x);
      return (s.outlineStyle !== "none" && parseFloat(s.outlineWidth) > 0) || s.boxShadow !== "none";
    };
    const heading = /^H[1-6]$/.test(el.tagName) && el.getAttribute("tabindex") === "-1";
    const label = el.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`) : null;
    const name = (el.getAttribute("aria-label") ?? el.textContent ?? label?.textContent ?? "").trim().slice(0, 40);
    const type = el.getAttribute("type") ? `[type=${el.getAttribute("type")}]` : "";
    return {
      on: `${el.tagName.toLowerCase()}${type} "${name}"`,
      visible: heading || ring(el) || ring(el.closest("label")) || ring(label),
    };
  });
}

/** Focus is somewhere other than <body>, with a visible ring. */
async function expectVisibleFocus(page: Page, after: string): Promise<void> {
  const state = await focusState(page);
  expect({ after, ...state, visible: state.on === "body" ? "dropped" : state.visible }).toEqual({
    after,
    on: state.on,
    visible: true,
  });
}

/** After a page change, focus sits on the new heading (focus-on-navigate) or on the page itself. */
async function expectFocusAfterNavigation(page: Page, after: string): Promise<void> {
  const state = await focusState(page);
  if (state.on === "body" || state.on.startsWith("h1")) return;
  expect({ after, visible: state.visible }).toEqual({ after, visible: true });
}

/** Presses Tab (or Shift+Tab) until `target` has focus, checking the ring after every press. */
async function tabTo(page: Page, target: Locator, { back = false, max = 250 } = {}): Promise<void> {
  for (let i = 0; i < max; i++) {
    if (await target.evaluate((el) => el === document.activeElement).catch(() => false)) return;
    await page.keyboard.press(back ? "Shift+Tab" : "Tab");
    const state = await focusState(page);
    // Tabbing past the last control leaves the document for the browser's own UI: go round again.
    if (state.on === "body") continue;
    expect({ tabbedTo: state.on, visible: state.visible }).toEqual({ tabbedTo: state.on, visible: true });
  }
  throw new Error(`Tab never reached ${String(target)}`);
}

/** axe-core (WCAG 2.0–2.2 A and AA) on an open dialog: nothing serious or critical. */
async function expectAccessibleDialog(page: Page, where: string): Promise<void> {
  const scan = await new AxeBuilder({ page })
    .withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"])
    .include("dialog[open]")
    .analyze();
  const bad = scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${where}: ${v.id} → ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`)).toEqual([]);
}

/** Signs in by keyboard alone from the sign-in page. */
async function keyboardSignIn(page: Page, email: string): Promise<void> {
  await page.goto(`${served.url}/sign-in`);
  await page.getByRole("heading", { name: "Sign in" }).waitFor();
  await tabTo(page, page.getByLabel("E-mail address"));
  await page.keyboard.type(email);
  await tabTo(page, page.getByLabel("Password"));
  await page.keyboard.type(DEMO_PASSWORD);
  await page.keyboard.press("Enter");
  await expect.poll(() => new URL(page.url()).pathname).not.toBe("/sign-in");
  await page.locator("main h1").first().waitFor();
  await expectFocusAfterNavigation(page, "signing in");
}

/** The first invalid control names an error that is shown and announced. */
async function expectAnnouncedError(page: Page, where: string): Promise<string> {
  const invalid = page.locator("[aria-invalid='true']").first();
  await invalid.waitFor();
  const found = await invalid.evaluate((el) => {
    const ids = (el.getAttribute("aria-describedby") ?? "").split(/\s+/).filter(Boolean);
    const described = ids.map((id) => document.getElementById(id)).filter((x): x is HTMLElement => !!x);
    const announced = described.find((d) =>
      d.closest("[role='alert'], [aria-live='assertive'], [aria-live='polite'], [role='status']"),
    );
    return { linked: described.length > 0, announced: announced ? announced.textContent!.trim() : "" };
  });
  expect({ where, linked: found.linked, announced: found.announced.length > 0 }).toEqual({
    where,
    linked: true,
    announced: true,
  });
  return found.announced;
}

describe("form errors are linked to their control and announced", () => {
  it("sign-in, the report's first step, the message box and the policy", async () => {
    const page = await newPage();
    // Sign-in with nothing typed.
    await page.goto(`${served.url}/sign-in`);
    await page.getByRole("heading", { name: "Sign in" }).waitFor();
    await tabTo(page, page.getByRole("button", { name: "Sign in" }));
    await page.keyboard.press("Enter");
    await expectAnnouncedError(page, "sign-in");
    await expectVisibleFocus(page, "empty sign-in");

    // The report's first step with nothing chosen.
    await keyboardSignIn(page, "tenant@example.org");
    await page.goto(`${served.url}/report`);
    await page.getByRole("heading", { level: 1, name: "Report damp or mould" }).waitFor();
    await tabTo(page, page.getByRole("button", { name: "Next" }));
    await page.keyboard.press("Enter");
    await expectAnnouncedError(page, "report, first step");
    await expectVisibleFocus(page, "empty report step");

    // The message box on the tenant's case page, sent empty.
    const robin = await signedInClient(served.app, "tenant@example.org", DEMO_PASSWORD);
    const c = (
      await robin
        .post("/api/cases", {
          description: "Mould is coming back on the kitchen wall behind the fridge.",
          locations: ["external-wall"],
          observations: ["mould-spots"],
        })
        .expect(201)
    ).body;
    await page.goto(`${served.url}/cases/${c.id}`);
    await page.getByRole("heading", { level: 1, name: c.reference }).waitFor();
    // The conversation is behind its heading: open it by keyboard.
    const messages = page.getByRole("button", { name: /^Messages with your landlord/ });
    await tabTo(page, messages);
    await page.keyboard.press("Enter");
    const send = page.getByRole("button", { name: "Send to your landlord" });
    await send.waitFor();
    await tabTo(page, send);
    await page.keyboard.press("Enter");
    await expectAnnouncedError(page, "message box");
    await expectVisibleFocus(page, "empty message");

    // The policy with a timeframe emptied.
    await page.getByRole("button", { name: "Sign out" }).focus();
    await page.keyboard.press("Enter");
    await page.getByRole("heading", { name: "Sign in" }).waitFor();
    await keyboardSignIn(page, "admin@example.org");
    await page.goto(`${served.url}/admin/policy`);
    const first = page.getByRole("group", { name: "Timeframes" }).getByRole("textbox").first();
    await first.waitFor();
    await tabTo(page, first);
    await page.keyboard.press("Control+A");
    await page.keyboard.press("Backspace");
    await page.keyboard.press("Enter");
    await expectAnnouncedError(page, "policy");
    await expectVisibleFocus(page, "empty policy field");
    await page.close();
  });
});

describe("keyboard-only journeys", () => {
  it("a tenant reports damp with a photo, by keyboard", async () => {
    const photo = path.join(scratch, "sill.jpg");
    writeFileSync(photo, await jpegWithGps(1200, 900));
    const page = await newPage();
    await keyboardSignIn(page, "tenant@example.org");
    await page.goto(`${served.url}/report`);
    await page.getByRole("heading", { level: 1, name: "Report damp or mould" }).waitFor();

    await tabTo(page, page.getByLabel("What can you see?"));
    await page.keyboard.type("Water collects on the bedroom window sill every morning and the paint is peeling.");
    for (const choice of ["Window or window frame", "Water on the glass or sills", "Bedroom 1"]) {
      await tabTo(page, page.getByLabel(choice));
      await page.keyboard.press("Space");
      expect(await page.getByLabel(choice).isChecked()).toBe(true);
    }
    // Through the steps with Next; each step keeps focus in the page.
    for (let step = 0; step < 3; step++) {
      await tabTo(page, page.getByRole("button", { name: "Next" }));
      await page.keyboard.press("Enter");
      await expectVisibleFocus(page, `Next (step ${step + 2})`);
    }
    // The photo: a file chooser is the system's own window, so the file is handed to the input.
    const picker = page.getByLabel("Add photos");
    await tabTo(page, picker);
    await picker.setInputFiles(photo);
    await expectVisibleFocus(page, "choosing a photo");
    await tabTo(page, page.getByRole("button", { name: "Next" }));
    await page.keyboard.press("Enter");
    await expectVisibleFocus(page, "Next (readings)");
    await tabTo(page, page.getByRole("button", { name: "Next" }));
    await page.keyboard.press("Enter");
    await expectVisibleFocus(page, "Next (check)");
    await tabTo(page, page.getByRole("button", { name: "Send report" }));
    await page.keyboard.press("Enter");
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toMatch(/^DW-\d{4}-\d{5}$/);
    await expectFocusAfterNavigation(page, "sending the report");
    await page.close();
  });

  it("an officer opens a case from the queue and changes its status, by keyboard", async () => {
    const robin = await signedInClient(served.app, "tenant@example.org", DEMO_PASSWORD);
    const c = (
      await robin
        .post("/api/cases", {
          description: "Damp patch spreading under the living room window after the rain.",
          locations: ["window"],
          observations: ["mould-spots"],
        })
        .expect(201)
    ).body;
    // The queue lists a new report once it has been triaged (in the background): wait for that first.
    const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
    await expect
      .poll(async () => {
        const res = await officer.get(`/api/cases?q=${encodeURIComponent(c.reference)}`).expect(200);
        return JSON.stringify(res.body).includes(c.reference);
      })
      .toBe(true);
    const page = await newPage();
    await keyboardSignIn(page, "officer@example.org");
    await page.goto(`${served.url}/queue?q=${encodeURIComponent(c.reference)}`);
    const link = page.getByRole("table", { name: "Case queue" }).getByRole("link", { name: c.reference });
    await link.waitFor();
    await tabTo(page, link);
    await page.keyboard.press("Enter");
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toContain(c.reference);
    await expectFocusAfterNavigation(page, "opening the case");

    await tabTo(page, page.getByRole("button", { name: "Change the status" }));
    await page.keyboard.press("Enter");
    const moveTo = page.getByRole("combobox", { name: "Move to" });
    await expect.poll(() => moveTo.evaluate((el) => el === document.activeElement)).toBe(true);
    await expectVisibleFocus(page, "opening the status form");
    await page.keyboard.press("ArrowDown");
    expect(await moveTo.inputValue()).not.toBe("");
    await tabTo(page, page.getByRole("textbox", { name: "Reason" }));
    await page.keyboard.type("Checked with the tenant by phone; moving on by hand for the audit.");
    await tabTo(page, page.getByRole("button", { name: "Change status", exact: true }));
    await page.keyboard.press("Enter");
    await page.getByText(/The status is now/).waitFor();
    await expectVisibleFocus(page, "changing the status");
    await page.close();
  });

  it("the maintenance lead books a visit from a free slot, by keyboard", async () => {
    // Sam's investigated case with a work order to book.
    const sam = await signedInClient(served.app, "tenant2@example.org", DEMO_PASSWORD);
    const home = (await sam.get("/api/me/home").expect(200)).body.property;
    const bathroomId = home.rooms.find((r: { kind: string }) => r.kind === "bathroom").id;
    const created = (
      await sam
        .post("/api/cases", {
          description: "The bathroom fan has stopped and the ceiling is going black.",
          locations: ["ceiling"],
          observations: ["mould-spots", "condensation"],
          roomIds: [bathroomId],
        })
        .expect(201)
    ).body;
    const officer = await signedInClient(served.app, "officer@example.org", DEMO_PASSWORD);
    await officer
      .post(`/api/cases/${created.id}/inspections`, {
        inspectedAt: msAgo(2 * HOUR).toISOString(),
        cause: "condensation",
        mouldExtent: "under-1-m2",
        findings: "The extract fan has failed; condensation mould on the ceiling.",
        roomReadings: [],
      })
      .expect(201);
    await officer
      .post(`/api/cases/${created.id}/work-orders`, {
        type: "extractor-fan",
        description: "Replace the fan.",
        roomIds: [bathroomId],
      })
      .expect(201);

    const day = workingDaysAhead(45, 1)[0]!;
    const d = new Date(`${day}T12:00:00Z`);
    d.setUTCDate(d.getUTCDate() - ((d.getUTCDay() + 6) % 7));
    const monday = d.toISOString().slice(0, 10);
    const weekday = new Date(`${day}T12:00:00Z`).toLocaleDateString("en-GB", {
      weekday: "long",
      day: "numeric",
      month: "long",
      timeZone: "UTC",
    });

    const page = await newPage();
    await keyboardSignIn(page, "maintenance@example.org");
    await page.goto(`${served.url}/works?week=${monday}`);
    await page.getByRole("table", { name: /Bookings for the week of/ }).waitFor();
    await tabTo(page, page.getByRole("button", { name: `Free: book Dale Whitcombe, ${weekday}, Morning 8–12` }));
    await page.keyboard.press("Enter");
    const picker = page.getByRole("dialog", { name: "Book this free slot" });
    await picker.waitFor();
    await expectVisibleFocus(page, "opening the free slot");
    await expectAccessibleDialog(page, "Book this free slot");
    const order = picker.getByRole("radio", { name: new RegExp(`^${created.reference}: `) });
    await tabTo(page, picker.getByRole("radio").first());
    await page.keyboard.press("Space");
    // Radios of one group are one Tab stop: arrows move between them.
    for (let i = 0; i < 50 && !(await order.isChecked()); i++) {
      await page.keyboard.press("ArrowDown");
      await expectVisibleFocus(page, "choosing the order");
    }
    expect(await order.isChecked()).toBe(true);
    await tabTo(page, picker.getByRole("button", { name: "Continue" }));
    await page.keyboard.press("Enter");
    const dialog = page.getByRole("dialog", { name: `Schedule ${created.reference}` });
    await dialog.waitFor();
    await expectVisibleFocus(page, "opening the schedule");
    await expectAccessibleDialog(page, "Schedule");
    await tabTo(page, dialog.getByRole("button", { name: "Book the visit" }));
    await page.keyboard.press("Enter");
    await page.getByText(`${created.reference} is booked`).waitFor();
    await expectVisibleFocus(page, "booking the visit");
    await page.close();
  });

  it("an admin opens the policy and saves it, by keyboard", async () => {
    const page = await newPage();
    await keyboardSignIn(page, "admin@example.org");
    // To the policy through the navigation, not by address.
    await tabTo(
      page,
      page
        .getByRole("navigation")
        .getByRole("link", { name: /policy/i })
        .first(),
    );
    await page.keyboard.press("Enter");
    await expect.poll(() => new URL(page.url()).pathname).toBe("/admin/policy");
    await page.getByRole("group", { name: "Timeframes" }).waitFor();
    await expectFocusAfterNavigation(page, "opening the policy");
    const phone = page.getByLabel("Emergency telephone number");
    await tabTo(page, phone);
    await page.keyboard.press("Control+A");
    await page.keyboard.type("0300 123 4567");
    await tabTo(page, page.getByRole("button", { name: "Save", exact: true }));
    await page.keyboard.press("Enter");
    await page.getByText(/^Saved\./).waitFor();
    await expectVisibleFocus(page, "saving the policy");
    await page.close();
  });
});
