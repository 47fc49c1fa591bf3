import "reflect-metadata";
import { DataSource } from "typeorm";
import type { Config } from "../config/env.js";
import { entities } from "./entities.js";
import { migrations } from "./migrations.js";

export function createDataSource(db: Config["db"]): DataSource {
  return new DataSource({
    type: "mariadb",
    host: db.host,
    port: db.port,
    username: db.user,
    password: db.password,
    database: db.name,
    charset: "utf8mb4_unicode_ci",
    // Every DATETIME column holds UTC.
    timezone: "Z",
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: false,
    poolSize: 10,
    extra: { connectTimeout: 5000 },
  });
}
