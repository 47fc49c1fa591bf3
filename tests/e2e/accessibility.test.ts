// The accessibility audit (WCAG 2.2 AA, as far as a machine can check it): every route in
// src/app/router.tsx opened by each role that may see it, plus the signed-out pages, a case page for the
// tenant and for staff, a home and a sensor. On each page:
// - axe-core with the WCAG 2.0/2.1/2.2 A and AA rule tags: no serious or critical finding;
// - reflow (1.4.10): at 320 CSS px wide, and at 640 (a 1 280 px screen zoomed to 200 %), the page does
//   not scroll sideways (a data table may scroll inside its own box);
// - reduced motion: with `prefers-reduced-motion: reduce` no element animates or transitions for more
//   than 0.01 s.
// Findings are gathered for the whole role and printed together (rule, target, page), so one run shows
// everything that needs fixing.
import { AxeBuilder } from "@axe-core/playwright";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { signIn } from "../support/journey.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";
import { signedInClient } from "../support/test-app.js";
import { msAgo } from "../support/test-clock.js";

const WCAG_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"];
/** 320 CSS px (WCAG 1.4.10's width) and a 1 280 px laptop at 200 % zoom. */
const REFLOW_WIDTHS = [320, 640];
const AUDIT_VIEWPORT = { width: 1280, height: 900 };

let served: ServedApp;
let browser: Browser;
let tenantCaseId: number;
let homeId: number;
let sensorId: number;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  // A case of Robin's own, so the tenant and the staff case pages have content.
  const robin = await signedInClient(served.app, "tenant@example.org", DEMO_PASSWORD);
  const home = (await robin.get("/api/me/home").expect(200)).body.property;
  homeId = home.id;
  const room = home.rooms[0];
  const created = await robin
    .post("/api/cases", {
      description: "Black spots are spreading on the bathroom ceiling and the window sill is wet most mornings.",
      locations: ["ceiling", "window"],
      observations: ["mould-spots", "condensation"],
      area: "a4",
      roomIds: [room.id],
    })
    .expect(201);
  tenantCaseId = created.body.id;
  await robin
    .post(
      `/api/cases/${tenantCaseId}/readings`,
      Array.from({ length: 24 }, (_, h) => ({
        roomId: room.id,
        takenAt: msAgo((24 - h) * 3_600_000).toISOString(),
        airTemperatureC: 18 + h / 12,
        relativeHumidityPct: 70 + (h % 6),
        surfaceTemperatureC: 12,
      })),
    )
    .expect(201);
  // A sensor in the same home, so the sensor page has one to show.
  const lead = await signedInClient(served.app, "maintenance@example.org", DEMO_PASSWORD);
  const sensor = await lead
    .post("/api/sensors", {
      propertyId: home.id,
      roomId: room.id,
      serial: "A11Y-AUDIT-0001",
      model: "Audit probe",
      placement: "Bathroom, outside wall, 1.2 m up",
      measuresSurface: true,
      intervalS: 900,
      installedOn: msAgo(3 * 86_400_000)
        .toISOString()
        .slice(0, 10),
    })
    .expect(201);
  sensorId = sensor.body.sensor?.id ?? sensor.body.id;
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

/** A fresh signed-out page with reduced motion asked for. */
async function newPage(): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.emulateMedia({ reducedMotion: "reduce" });
  await page.setViewportSize(AUDIT_VIEWPORT);
  return page;
}

/** A page is ready when its heading is shown and nothing is still loading. */
async function ready(page: Page): Promise<void> {
  await page.locator("h1").first().waitFor();
  await expect.poll(() => page.evaluate(() => document.querySelectorAll("svg.animate-spin, [aria-busy='true']").length)).toBe(0);
}

/** Everything that scrolls the whole page sideways, by the widest element sticking out. */
async function overflowAt(page: Page, width: number): Promise<string | null> {
  await page.setViewportSize({ width, height: 800 });
  // Two frames, so the layout has settled at the new width before it is measured.
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  return page.evaluate(() => {
    const extra = document.documentElement.scrollWidth - window.innerWidth;
    if (extra <= 0) return null;
    // The outermost elements whose right edge passes the viewport, outside a scrolling box.
    const culprits: string[] = [];
    for (const el of Array.from(document.body.querySelectorAll<HTMLElement>("*"))) {
      if (el.getBoundingClientRect().right <= window.innerWidth + 0.5) continue;
      let inner = false;
      for (let p = el.parentElement; p && p !== document.body; p = p.parentElement) {
        const ox = getComputedStyle(p).overflowX;
        if (ox === "auto" || ox === "scroll" || ox === "hidden" || ox === "clip") inner = true;
        if (p.getBoundingClientRect().right > window.innerWidth + 0.5) inner = true;
        if (inner) break;
      }
      if (inner) continue;
      const id = el.id ? `#${el.id}` : "";
      const cls = typeof el.className === "string" ? `.${el.className.trim().split(/\s+/).slice(0, 4).join(".")}` : "";
      culprits.push(`${el.tagName.toLowerCase()}${id}${cls}`);
      if (culprits.length >= 3) break;
    }
    return `${extra} px too wide (${culprits.join(", ")})`;
  });
}

/** Elements that still animate or transition for longer than 0.01 s. */
function longMotion(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const seconds = (list: string) =>
      Math.max(...list.split(",").map((v) => (v.trim().endsWith("ms") ? parseFloat(v) / 1000 : parseFloat(v)) || 0));
    const found: string[] = [];
    for (const el of Array.from(document.querySelectorAll<HTMLElement>("*"))) {
      for (const pseudo of [null, "::before", "::after"]) {
        const s = getComputedStyle(el, pseudo);
        const animated = s.animationName !== "none" && seconds(s.animationDuration) > 0.01;
        const transitioned = s.transitionProperty !== "none" && seconds(s.transitionDuration) > 0.01;
        if (animated || transitioned) {
          const cls = typeof el.className === "string" ? `.${el.className.trim().split(/\s+/).slice(0, 3).join(".")}` : "";
          found.push(`${el.tagName.toLowerCase()}${pseudo ?? ""}${cls}`);
        }
      }
      if (found.length >= 3) break;
    }
    return found;
  });
}

/** axe, reflow and motion on the page as it is now; findings are added to `findings`. */
async function audit(page: Page, where: string, findings: string[]): Promise<void> {
  const scan = await new AxeBuilder({ page }).withTags(WCAG_TAGS).analyze();
  for (const v of scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical"))
    findings.push(`${where}: ${v.id} (${v.impact}) ${v.help} → ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  for (const el of await longMotion(page)) findings.push(`${where}: motion under reduced motion → ${el}`);
  for (const width of REFLOW_WIDTHS) {
    const over = await overflowAt(page, width);
    if (over) findings.push(`${where} at ${width} px: ${over}`);
  }
  await page.setViewportSize(AUDIT_VIEWPORT);
}

async function auditPaths(page: Page, role: string, paths: string[]): Promise<string[]> {
  const findings: string[] = [];
  for (const path of paths) {
    await page.goto(`${served.url}${path}`);
    await ready(page);
    await audit(page, `${role} ${path}`, findings);
  }
  return findings;
}

describe("every page, each role, at WCAG 2.2 AA", () => {
  it("signed out: sign-in, forgot password, the token pages, the calculator and not-found", async () => {
    const page = await newPage();
    const findings = await auditPaths(page, "visitor", [
      "/sign-in",
      "/forgot-password",
      "/reset-password/not-a-real-token",
      "/unlock-sign-in/not-a-real-token",
      "/invitation/not-a-real-token",
      "/calculator",
      "/no-such-page",
    ]);
    // The sign-in form with its errors showing.
    await page.goto(`${served.url}/sign-in`);
    await ready(page);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.locator("[aria-invalid='true']").first().waitFor();
    await audit(page, "visitor /sign-in (errors shown)", findings);
    expect(findings).toEqual([]);
    await page.close();
  });

  it("tenant: my home, report, my reports, a case, the calculator", async () => {
    const page = await newPage();
    await signIn(page, served.url, "tenant@example.org");
    const findings = await auditPaths(page, "tenant", [
      "/home",
      "/report",
      "/cases",
      `/cases/${tenantCaseId}`,
      "/calculator",
      "/no-such-page",
    ]);
    expect(findings).toEqual([]);
    await page.close();
  });

  it("officer: queue, alerts, homes, a home, dashboard, sensors, a sensor, log a report, a case", async () => {
    const page = await newPage();
    await signIn(page, served.url, "officer@example.org");
    const findings = await auditPaths(page, "officer", [
      "/queue",
      "/alerts",
      "/homes",
      `/homes/${homeId}`,
      "/dashboard",
      "/sensors",
      `/sensors/${sensorId}`,
      "/sensors/health",
      "/log-report",
      `/cases/${tenantCaseId}`,
    ]);
    // Each tab of the staff case workspace.
    const tabs = page.getByRole("tablist", { name: "Parts of the case" });
    const names = await tabs.getByRole("tab").allTextContents();
    for (const name of names.slice(1)) {
      await tabs.getByRole("tab", { name: name.trim(), exact: true }).click();
      await ready(page);
      await audit(page, `officer /cases/${tenantCaseId} tab "${name.trim()}"`, findings);
    }
    expect(findings).toEqual([]);
    await page.close();
  });

  it("maintenance: works, sensors, a sensor, homes, a home, dashboard, a case", async () => {
    const page = await newPage();
    await signIn(page, served.url, "maintenance@example.org");
    const findings = await auditPaths(page, "maintenance", [
      "/works",
      "/sensors",
      `/sensors/${sensorId}`,
      "/sensors/health",
      "/homes",
      `/homes/${homeId}`,
      "/dashboard",
      `/cases/${tenantCaseId}`,
    ]);
    expect(findings).toEqual([]);
    await page.close();
  });

  it("admin: people, policy, e-mails, integrations, webhooks, imports, a new home, queue and works", async () => {
    const page = await newPage();
    await signIn(page, served.url, "admin@example.org");
    const findings = await auditPaths(page, "admin", [
      "/admin",
      "/admin/policy",
      "/admin/emails",
      "/admin/integrations",
      "/admin/webhooks",
      "/admin/tenancy-import",
      "/admin/stock-import",
      "/homes/new",
      "/queue",
      "/works",
    ]);
    expect(findings).toEqual([]);
    await page.close();
  });
});
