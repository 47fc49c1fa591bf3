// `npm run seed`: migrations, then the demo scenario, into the database the configuration points at.
import { loadConfig, type Config } from "../server/config/env.js";
import { createDataSource } from "../server/db/create-data-source.js";
import { migrateToLatest } from "../server/db/migrate.js";
import { seedDemo } from "../server/db/seeds/demo.js";

export async function runSeed(config: Config): Promise<string> {
  if (config.env === "production") {
    throw new Error("Refusing to seed demo data with NODE_ENV=production.");
  }
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  try {
    // A development convenience: `npm run seed` alone brings a fresh database up to date first.
    await migrateToLatest(dataSource);
    const result = await seedDemo(dataSource, config.demoPassword);
    return result.created
      ? `Demo data created: ${result.homes} homes, ${result.tenants} tenant accounts, ${result.cases} cases.`
      : `Demo data already present; demo account passwords set again${result.cases ? `, ${result.cases} demo cases added` : ""}.`;
  } finally {
    await dataSource.destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  console.log(await runSeed(loadConfig()));
}
