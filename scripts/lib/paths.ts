import path from "node:path";
import { fileURLToPath } from "node:url";

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
export const projectDbDir = path.join(projectRoot, ".data", "mariadb");
/** npm start's and npm run dev's MQTT broker: its config, password file, ACL, pid file and log. */
export const projectBrokerDir = path.join(projectRoot, ".data", "mosquitto");
