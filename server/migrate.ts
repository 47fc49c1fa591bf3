// `npm run db:migrate` (node dist-server/server/migrate.js): brings the configured database to the
// latest migration and exits. Run it before starting a new version of the server.
import { loadConfig } from "./config/env.js";
import { createDataSource } from "./db/create-data-source.js";
import { migrateToLatest } from "./db/migrate.js";
import { createLogger } from "./lib/logger.js";

const config = loadConfig();
const logger = createLogger(config.logLevel);
const dataSource = createDataSource(config.db);
try {
  await dataSource.initialize();
  const ran = await migrateToLatest(dataSource);
  logger.info(
    { migrations: ran },
    ran.length ? `ran ${ran.length} migration(s)` : "the database was already at the latest migration",
  );
} catch (error) {
  logger.fatal({ err: error }, "migration failed");
  process.exitCode = 1;
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}
