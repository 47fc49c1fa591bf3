// The real app with the built client, listening on a free loopback port, with the demo data seeded.
import type { Server } from "node:http";
import { seedDemo } from "../../server/db/seeds/demo.js";
import { createTestApp, type TestApp } from "./test-app.js";

export const DEMO_PASSWORD = "dewline-demo";

export interface ServedApp extends TestApp {
  url: string;
}

export async function serveDemoApp(): Promise<ServedApp> {
  const t = await createTestApp();
  await seedDemo(t.ctx.dataSource, DEMO_PASSWORD, t.ctx.clock.now());
  const server: Server = await new Promise((resolve) => {
    const s = t.app.listen(0, "127.0.0.1", () => resolve(s));
  });
  const address = server.address();
  const port = typeof address === "object" && address ? address.port : 0;
  return {
    ...t,
    url: `http://127.0.0.1:${port}`,
    async close() {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      await t.close();
    },
  };
}
