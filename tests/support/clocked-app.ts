// A test app whose clock the test moves by hand (sign-in delays, session touches), built like
// createTestApp() but on a ManualClock instead of the shared test clock.
import { createApp } from "../../server/app.js";
import { createAppContext } from "../../server/app-context.js";
import { loadConfig } from "../../server/config/env.js";
import type { Clock } from "../../server/lib/clock.js";
import { startMailCatcher } from "./mail-catcher.js";
import { testClock } from "./test-clock.js";
import type { TestApp } from "./test-app.js";

/** Stands still at the test clock's "now" when made, until the test moves it forward. */
export class ManualClock implements Clock {
  private readonly startMs = testClock.now().getTime();
  private offsetMs = 0;
  now(): Date {
    return new Date(this.startMs + this.offsetMs);
  }
  advance(ms: number): void {
    this.offsetMs += ms;
  }
}

export async function createClockedApp(clock: Clock, env: Record<string, string> = {}): Promise<TestApp> {
  const mail = await startMailCatcher();
  const config = loadConfig({ ...process.env, SMTP_PORT: String(mail.port), APP_URL: "http://dewline.test", ...env });
  const ctx = await createAppContext(config, { clock });
  const app = createApp(ctx);
  return {
    ctx,
    app,
    mail,
    async close() {
      await ctx.close();
      await mail.close();
    },
  };
}
