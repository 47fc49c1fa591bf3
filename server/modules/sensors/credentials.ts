// A sensor's secret in the form mosquitto's password file keeps (`mosquitto_passwd`, mosquitto 2.0):
// `$7$<iterations>$<base64 salt>$<base64 PBKDF2-HMAC-SHA512(secret, salt, iterations, 64 bytes)>`.
// Checked against Debian's mosquitto 2.0.11: a hash made here lets the device connect, and the same
// line as written by mosquitto_passwd verifies here (tests/server/sensors-mqtt.test.ts).
import { pbkdf2Sync, randomBytes } from "node:crypto";

/** mosquitto_passwd's own iteration count for `$7$`; the broker reads the count from each line. */
const ITERATIONS = 101;

export function mosquittoPasswordHash(secret: string): string {
  const salt = randomBytes(12);
  const hash = pbkdf2Sync(secret, salt, ITERATIONS, 64, "sha512");
  return `$7$${ITERATIONS}$${salt.toString("base64")}$${hash.toString("base64")}`;
}
