// Debian's Chromium driven by playwright-core, with a fresh profile per launch.
// Tests wait for what a person waits for (a heading, a role, a URL), never for a fixed time; every
// wait is sized for a busy 2-core machine: Playwright's locator waits and actions (WAIT_MS here) and
// vitest's expect.poll (the e2e project's expect.poll.timeout in vite.config.ts).
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium, type BrowserContext } from "playwright-core";

/** How long a locator wait, action or navigation may take before the test fails. */
export const WAIT_MS = 20_000;

export interface Browser {
  context: BrowserContext;
  close(): Promise<void>;
}

export async function launchBrowser(): Promise<Browser> {
  const profile = mkdtempSync(path.join(tmpdir(), "dewline-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
  context.setDefaultTimeout(WAIT_MS);
  context.setDefaultNavigationTimeout(WAIT_MS);
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
