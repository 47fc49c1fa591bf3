// Points loadConfig() at this run's throwaway MariaDB before any test imports the server.
import { inject } from "vitest";

const db = inject("testDb");
Object.assign(process.env, {
  NODE_ENV: "test",
  DB_HOST: db.host,
  DB_PORT: String(db.port),
  DB_NAME: db.name,
  DB_USER: db.user,
  DB_PASSWORD: db.password,
});
