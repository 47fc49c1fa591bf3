// Builds the real app against the run's throwaway MariaDB and an in-process SMTP catcher, on the test clock.
import type { Express } from "express";
import request from "supertest";
import { createApp, type AppOptions } from "../../server/app.js";
import { createAppContext, type AppContext } from "../../server/app-context.js";
import { loadConfig, type Config } from "../../server/config/env.js";
import { startMailCatcher, type MailCatcher } from "./mail-catcher.js";
import { testClock } from "./test-clock.js";
import type { Clock } from "../../server/lib/clock.js";

export interface TestApp {
  ctx: AppContext;
  app: Express;
  mail: MailCatcher;
  close(): Promise<void>;
}

/**
 * `clock`: the app's "now" (a test that moves time hands in its own, built on the test clock).
 * `options`: createApp's (two apps handed one `rateLimitScope` count rate limits together).
 */
export async function createTestApp(
  env: Record<string, string> = {},
  adjust?: (c: Config) => Config,
  clock: Clock = testClock,
  options: AppOptions = {},
): Promise<TestApp> {
  const mail = await startMailCatcher();
  let config = loadConfig({ ...process.env, SMTP_PORT: String(mail.port), APP_URL: "http://dewline.test", ...env });
  if (adjust) config = adjust(config);
  const ctx = await createAppContext(config, { clock });
  const app = createApp(ctx, options);
  // E-mails go out after the response (the outbox relay): lastTo() first waits for the relay to settle.
  // Reset and unlock links are queued after the reply, so wait for that work first.
  mail.settle = async () => {
    await ctx.services.auth.settled();
    await ctx.services.mail.relay.idle();
  };
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

/** A supertest agent that keeps cookies and sends the CSRF token like the client does. */
export interface Client {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
  get(url: string): request.Test;
  post(url: string, body?: object): request.Test;
  patch(url: string, body?: object): request.Test;
}

export async function anonymousClient(app: Express): Promise<Client> {
  const agent = request.agent(app);
  const res = await agent.get("/api/auth/csrf").expect(200);
  const client: Client = {
    agent,
    csrf: res.body.csrfToken as string,
    get: (url) => agent.get(url),
    post: (url, body) =>
      agent
        .post(url)
        .set("X-CSRF-Token", client.csrf)
        .send(body ?? {}),
    patch: (url, body) =>
      agent
        .patch(url)
        .set("X-CSRF-Token", client.csrf)
        .send(body ?? {}),
  };
  return client;
}

export async function signedInClient(app: Express, email: string, password: string): Promise<Client> {
  const client = await anonymousClient(app);
  const res = await client.post("/api/auth/login", { email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  client.csrf = res.body.csrfToken;
  return client;
}
