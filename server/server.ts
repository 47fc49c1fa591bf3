// Production entry: read config → connect and migrate → listen. Stops cleanly on SIGINT/SIGTERM.
import { loadConfig } from "./config/env.js";
import { createApp } from "./app.js";
import { createAppContext } from "./app-context.js";
import { startBackgroundJobs } from "./background.js";

const config = loadConfig();
const ctx = await createAppContext(config, { migrate: true });
const app = createApp(ctx);
const stopBackgroundJobs = startBackgroundJobs(ctx);
const server = app.listen(config.port, config.host, () => {
  ctx.logger.info(`Dewline listening on http://${config.host}:${config.port}`);
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  ctx.logger.info(`${signal}: closing`);
  stopBackgroundJobs();
  server.close();
  server.closeAllConnections();
  await ctx.close();
  process.exit(0);
}
process.on("SIGINT", () => void stop("SIGINT"));
process.on("SIGTERM", () => void stop("SIGTERM"));
