// The DataSource for the TypeORM CLI (migration:generate/run/revert). The app builds its own from Config.
import { loadConfig } from "../config/env.js";
import { createDataSource } from "./create-data-source.js";

export default createDataSource(loadConfig().db);
