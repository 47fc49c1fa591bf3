// `npm run landlord:add -- --name "Fenwold Housing" --admin-email ines@fenwold.example --admin-name "Ines Harrow"`:
// a fresh landlord (default deadline timeframes) and its first administrator, who gets the usual
// invitation e-mail to choose a password. Writes to the database the configuration points at: the one
// `npm start` runs (DB_* from the environment, development defaults otherwise), which must be running.
import { parseArgs } from "node:util";
import { createAppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { AppError } from "../server/lib/errors.js";
import { OrganisationService } from "../server/modules/organisations/organisation.service.js";

const USAGE = 'Usage: npm run landlord:add -- --name "Landlord name" --admin-email admin@example.org --admin-name "Their name"';

export async function addLandlord(argv: string[]): Promise<number> {
  let values: { name?: string; "admin-email"?: string; "admin-name"?: string };
  try {
    ({ values } = parseArgs({
      args: argv,
      options: { name: { type: "string" }, "admin-email": { type: "string" }, "admin-name": { type: "string" } },
    }));
  } catch (error) {
    console.error(`${(error as Error).message}\n${USAGE}`);
    return 2;
  }
  const config = loadConfig();
  const ctx = await createAppContext(config).catch((error: Error) => {
    throw new Error(
      `Could not reach the database at ${config.db.host}:${config.db.port} (${error.message}). ` +
        "Start it first: `npm start` (or `npm run db:start` and `npm run db:migrate`).",
    );
  });
  try {
    const { users, auth } = ctx.services;
    const added = await new OrganisationService(ctx.dataSource).addLandlord(
      { name: values.name ?? "", adminEmail: values["admin-email"] ?? "", adminName: values["admin-name"] ?? "" },
      { accounts: users, invitations: auth },
    );
    console.log(
      `Landlord "${added.name}" added (id ${added.organisationId}), on the default deadline timeframes.\n` +
        `${added.admin.name} <${added.admin.email}> is its administrator: an invitation e-mail to choose a password ` +
        "is in the outbox (the running server sends it if it has not gone yet; the link lasts 72 hours).",
    );
    if (config.env !== "production") console.log(`Mail inbox: http://127.0.0.1:${config.smtp.webPort}`);
    return 0;
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    const details = Array.isArray(error.details) ? (error.details as { message: string }[]).map((d) => d.message) : [];
    console.error(details.length ? details.join("\n") : error.message);
    if (error.status === 400) console.error(USAGE);
    return error.status === 400 ? 2 : 1;
  } finally {
    await ctx.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  process.exitCode = await addLandlord(process.argv.slice(2));
}
