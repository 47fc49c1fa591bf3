// Dewline's webhook signature (our own format, documented in DEVELOPERS.md "Verifying Dewline webhooks"):
//   Dewline-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<raw body>" keyed with the endpoint's secret>
// While a rotated-out secret is still valid, a second v1= carries its signature, so a receiver that
// has not switched yet keeps verifying. The timestamp is the attempt's, so each retry is signed afresh.
import { createHmac, randomBytes } from "node:crypto";

export const SIGNATURE_HEADER = "Dewline-Signature";
export const EVENT_ID_HEADER = "Dewline-Event-Id";
export const EVENT_TYPE_HEADER = "Dewline-Event-Type";
export const ATTEMPT_HEADER = "Dewline-Delivery-Attempt";

/** A new signing secret: 32 random bytes, with a prefix that says what it is when it turns up in a config file. */
export const newSigningSecret = (): string => `whsec_${randomBytes(32).toString("base64url")}`;

export const signatureOf = (secret: string, unixSeconds: number, body: string): string =>
  createHmac("sha256", secret).update(`${unixSeconds}.${body}`, "utf8").digest("hex");

/** The header's value for a body sent at `at`, signed with each of `secrets` (current first). */
export function signatureHeader(secrets: readonly string[], at: Date, body: string): string {
  const t = Math.floor(at.getTime() / 1000);
  return [`t=${t}`, ...secrets.map((s) => `v1=${signatureOf(s, t, body)}`)].join(",");
}
