// Which addresses a landlord may register. HTTPS only; plain http to this machine itself
// (localhost, 127.0.0.1, [::1]) only outside production, for the tests and the demo. In production
// an address naming this machine or a private network by its IP literal is refused too. A public name
// that resolves to a private address is not caught here (that needs the lookup at sending time).
import { isIP } from "node:net";

const LOOPBACK_NAMES = new Set(["localhost", "127.0.0.1", "[::1]"]);

/** IPv4/IPv6 literals of loopback, private, link-local and unspecified ranges (RFC 1918, RFC 4193, RFC 3927). */
function isPrivateLiteral(host: string): boolean {
  const bare = host.replace(/^\[|\]$/g, "").toLowerCase();
  const kind = isIP(bare);
  if (kind === 4) {
    const [a, b] = bare.split(".").map(Number) as [number, number];
    return (
      a === 0 ||
      a === 10 ||
      a === 127 ||
      (a === 169 && b === 254) ||
      (a === 172 && b >= 16 && b <= 31) ||
      (a === 192 && b === 168)
    );
  }
  if (kind === 6)
    return bare === "::" || bare === "::1" || /^f[cd]/.test(bare) || /^fe[89ab]/.test(bare) || bare.startsWith("::ffff:");
  return false;
}

/** Null when the address may be used, else what to tell the admin. */
export function endpointUrlProblem(raw: string, production: boolean): string | null {
  let url: URL;
  try {
    url = new URL(raw);
  } catch {
    return "Enter a full address, like https://example.org/dewline-events.";
  }
  if (url.username || url.password) return "Leave the user name and password out of the address.";
  if (url.hash) return "Leave the #part out of the address.";
  const local = LOOPBACK_NAMES.has(url.hostname.toLowerCase());
  if (url.protocol === "https:") {
    if (production && (local || isPrivateLiteral(url.hostname) || url.hostname.toLowerCase().endsWith(".localhost"))) {
      return "Use a public address: this server cannot send to itself or to a private network.";
    }
    return null;
  }
  if (url.protocol === "http:" && local && !production) return null;
  return "Use an https:// address (plain http is allowed only to this machine, outside production).";
}
