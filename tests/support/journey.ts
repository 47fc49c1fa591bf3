// What every journey test in the browser needs: the two screen sizes the journeys are walked at,
// signing in as a demo account, axe-core with no serious or critical findings, and the console's errors.
import { AxeBuilder } from "@axe-core/playwright";
import type { Page } from "playwright-core";
import { expect } from "vitest";
import { DEMO_PASSWORD } from "./served-app.js";

/** A phone in portrait and a laptop screen: every journey is walked at both. */
export const VIEWPORTS = {
  phone: { width: 390, height: 844 },
  desktop: { width: 1440, height: 900 },
} as const;
export type ViewportName = keyof typeof VIEWPORTS;

/** Signs in through the sign-in page and waits until the app has left it. */
export async function signIn(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect.poll(() => new URL(page.url()).pathname).not.toBe("/sign-in");
}

/** axe-core over the page as it is now: no serious or critical findings. */
export async function expectAccessible(page: Page): Promise<void> {
  const scan = await new AxeBuilder({ page }).analyze();
  const bad = scan.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(" ")).join(", ")})`)).toEqual([]);
}

/** Collects the console's errors and the page's uncaught exceptions from now on. */
export function consoleErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on("console", (message) => {
    if (message.type() === "error") errors.push(message.text());
  });
  page.on("pageerror", (error) => errors.push(error.message));
  return errors;
}

/** The document's width beyond the viewport, in CSS pixels (0 when nothing scrolls sideways). */
export async function horizontalOverflow(page: Page): Promise<number> {
  return page.evaluate(() => Math.max(0, document.documentElement.scrollWidth - window.innerWidth));
}
