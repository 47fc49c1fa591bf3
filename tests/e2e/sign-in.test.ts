// Each demo role signs in through the real client in Chromium and lands on its own home screen.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { launchBrowser, type Browser } from "../support/browser.js";
import { DEMO_PASSWORD, serveDemoApp, type ServedApp } from "../support/served-app.js";

let served: ServedApp;
let browser: Browser;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

async function signIn(page: Page, email: string) {
  await page.goto(`${served.url}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
}

const homes = [
  { email: "tenant@example.org", heading: "My home", path: "/home" },
  { email: "officer@example.org", heading: "Case queue", path: "/queue" },
  { email: "maintenance@example.org", heading: "Works", path: "/works" },
  { email: "admin@example.org", heading: "Users and invitations", path: "/admin" },
];

describe("signed-in journeys", () => {
  for (const home of homes) {
    it(`${home.email} signs in and sees ${home.heading}`, async () => {
      const page = await browser.context.newPage();
      try {
        await signIn(page, home.email);
        await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(home.heading);
        await expect.poll(() => new URL(page.url()).pathname).toBe(home.path);
        await page.getByRole("button", { name: "Sign out" }).click();
        await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("Sign in");
      } finally {
        await page.close();
      }
    });
  }

  it("shows the tenant's own address on My home, and a clear Not allowed page at an officer URL", async () => {
    const page = await browser.context.newPage();
    try {
      await signIn(page, "tenant@example.org");
      await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("My home");
      await expect.poll(() => page.getByText("Millbeck Terraces").first().isVisible()).toBe(true);
      await page.goto(`${served.url}/queue`);
      await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("Not allowed");
      await expect.poll(() => new URL(page.url()).pathname).toBe("/queue");
      // Wait until signing out has finished: the pages share one browser profile (and its cookie).
      await page.getByRole("button", { name: "Sign out" }).click();
      await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("Sign in");
    } finally {
      await page.close();
    }
  });

  it("shows the server's message for a wrong password, and a 404 page for an unknown path", async () => {
    const page = await browser.context.newPage();
    try {
      await page.goto(`${served.url}/sign-in`);
      await page.getByLabel("E-mail address").fill("officer@example.org");
      await page.getByLabel("Password").fill("not-the-password");
      await page.getByRole("button", { name: "Sign in" }).click();
      await expect.poll(() => page.getByRole("alert").first().textContent()).toMatch(/do not match/);
      await page.goto(`${served.url}/no/such/page`);
      await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe("Page not found");
    } finally {
      await page.close();
    }
  });
});
