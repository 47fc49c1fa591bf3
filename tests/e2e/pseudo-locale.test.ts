// Every tenant page in the pseudo-locales: with ?lang=en-XA no English is left outside ⟦ ⟧ (text that
// skipped translation), and with ?lang=ar-XB the page runs right to left. Then a tenant switches to
// Cymraeg in the header, sees the header and My home in Welsh, and it stays Welsh after a reload
// (kept on the server). Pages other helpers translate (report, case, calculator) pass once theirs land.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { signIn } from "../support/journey.js";
import { findUntranslated } from "../support/pseudo-locale.js";
import { serveDemoApp, type ServedApp } from "../support/served-app.js";

let served: ServedApp;
let browser: Browser;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let caseId: number;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
  // A landlord of its own: this file changes its tenant's language, which no other test should see.
  landlord = await makeLandlord(served.ctx.dataSource);
}, 120_000);
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

const h1 = (page: Page) => page.getByRole("heading", { level: 1 }).textContent();

describe("the pseudo-locales", () => {
  it("leave no English outside ⟦ ⟧ on any tenant page", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.goto(`${served.url}/sign-in?lang=en-XA`);
    await expect.poll(() => h1(page)).toContain("⟦");
    expect(await findUntranslated(page)).toEqual([]);

    await page.getByLabel(/É-ɱáíļ/).fill(landlord.tenant.email);
    await page.getByLabel(/Þáššŵóŕð/).fill(PASSWORD);
    await page.getByRole("button", { name: /Šíĝñ íñ/ }).click();
    await expect.poll(() => new URL(page.url()).pathname).toBe("/home");
    await expect.poll(() => h1(page)).toContain("Ṁý ĥóɱé");
    await page.getByRole("heading", { name: /Ýóúŕ ŕéþóŕţš/ }).waitFor();
    // The condensation outlook's tips, cautions and method lines are said by id in the reader's language too.
    expect(await findUntranslated(page)).toEqual([]);

    await page.goto(`${served.url}/cases`);
    await expect.poll(() => h1(page)).toContain("Ṁý ŕéþóŕţš");
    expect(await findUntranslated(page)).toEqual([]);

    // Other helpers' pages: they pass once their text lands.
    await page.goto(`${served.url}/report`);
    await expect.poll(() => h1(page)).toContain("⟦");
    expect(await findUntranslated(page)).toEqual([]);

    const created = await page.evaluate(async () => {
      const csrf = (await (await fetch("/api/auth/csrf")).json()) as { csrfToken: string };
      const res = await fetch("/api/cases", {
        method: "POST",
        headers: { "content-type": "application/json", "x-csrf-token": csrf.csrfToken },
        body: JSON.stringify({
          description: "Mould by the bathroom window.",
          locations: ["window"],
          observations: ["mould-spots"],
        }),
      });
      return (await res.json()) as { id: number };
    });
    caseId = created.id;
    await page.goto(`${served.url}/cases/${caseId}`);
    await expect.poll(() => h1(page)).toBeTruthy();
    expect(await findUntranslated(page)).toEqual([]);

    await page.goto(`${served.url}/calculator`);
    await expect.poll(() => h1(page)).toContain("⟦");
    expect(await findUntranslated(page)).toEqual([]);
    await page.close();
  });

  it("turn the page right to left in ar-XB: the header's first link sits to the right of the last", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.goto(`${served.url}/sign-in?lang=en-GB`);
    await signIn(page, served.url, landlord.tenant.email, PASSWORD);
    await page.goto(`${served.url}/home?lang=ar-XB`);
    await expect.poll(() => page.evaluate(() => document.documentElement.dir)).toBe("rtl");
    const links = page.locator("header nav a");
    await expect.poll(() => links.count()).toBeGreaterThan(1);
    const first = await links.first().boundingBox();
    const last = await links.last().boundingBox();
    expect(first!.x).toBeGreaterThan(last!.x);
    await page.close();
  });
});

describe("Welsh", () => {
  it("a tenant switches to Cymraeg in the header, and it stays after a reload", async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.goto(`${served.url}/sign-in?lang=en-GB`);
    await signIn(page, served.url, landlord.tenant.email, PASSWORD);
    await expect.poll(() => h1(page)).toBe("My home");
    // The ?lang= pick of this tab is forgotten once the tenant chooses.
    await page.locator("header").getByRole("button", { name: "Cymraeg" }).click();
    await expect.poll(() => h1(page)).toBe("Fy nghartref");
    await expect.poll(() => page.evaluate(() => document.documentElement.lang)).toBe("cy");
    await page.locator("header").getByRole("link", { name: "Fy adroddiadau" }).waitFor();
    await page.locator("header").getByRole("button", { name: "Allgofnodi" }).waitFor();
    await page.getByRole("heading", { name: "Eich cyfeiriad" }).waitFor();

    // Kept on the server: a new tab with nothing on this device still opens in Welsh.
    await page.evaluate(() => {
      localStorage.clear();
      sessionStorage.clear();
    });
    await page.reload();
    await expect.poll(() => h1(page)).toBe("Fy nghartref");
    await page.close();
  });
});
