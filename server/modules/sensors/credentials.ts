// A sensor's one secret and the two forms it is kept in: SHA-256 (the HTTP ingest looks the device up by
// it) and mosquitto's password-file form (the broker checks MQTT logins against it). The secret itself is
// shown once, when issued, and stored nowhere.
import { createHash, pbkdf2Sync, randomBytes } from "node:crypto";

/** Every device secret starts with this, so one found in a log or a config file is recognisable. */
export const SENSOR_SECRET_PREFIX = "dws_";
/** `dws_` and 43 base64url characters: 32 bytes from the operating system's random source. */
export const SENSOR_SECRET_PATTERN = /^dws_[A-Za-z0-9_-]{43}$/;

/** A new device secret: 256 random bits, base64url, with the prefix. */
export function newSensorSecret(): string {
  return `${SENSOR_SECRET_PREFIX}${randomBytes(32).toString("base64url")}`;
}

/**
 * SHA-256 (hex), unsalted: the secret has 256 random bits, so there is nothing to guess and no two alike;
 * a slow password hash would only cost CPU on every ingest request (the same reasoning as API keys).
 */
export function sensorKeyHash(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}

/** mosquitto's `$7$` form: PBKDF2-SHA512, 101 iterations (mosquitto_passwd's default), 12-byte salt, 64-byte hash. */
const MOSQUITTO_ITERATIONS = 101;
const MOSQUITTO_SALT_BYTES = 12;
const MOSQUITTO_HASH_BYTES = 64;

/**
 * `$7$101$<base64 salt>$<base64 hash>` as mosquitto_passwd writes it (mosquitto 2.x, `password_file`);
 * the PBKDF2 work is done here once per issue, never per login.
 */
export function mosquittoPasswordHash(secret: string, salt: Buffer = randomBytes(MOSQUITTO_SALT_BYTES)): string {
  const hash = pbkdf2Sync(secret, salt, MOSQUITTO_ITERATIONS, MOSQUITTO_HASH_BYTES, "sha512");
  return `$7$${MOSQUITTO_ITERATIONS}$${salt.toString("base64")}$${hash.toString("base64")}`;
}
