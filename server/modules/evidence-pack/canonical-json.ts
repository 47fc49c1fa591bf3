/**
 * The facts of a pack as one exact string: JSON with every object's keys sorted (by UTF-16 code
 * units, as JavaScript sorts strings), no spaces, strings and numbers written as JSON.stringify writes
 * them, dates as ISO 8601 UTC. This is the key order and number form of RFC 8785 (JCS), so anyone
 * can write the same bytes from the same facts.
 */
export function canonicalJson(value: unknown): string {
  const plain: unknown = JSON.parse(JSON.stringify(value));
  const write = (v: unknown): string => {
    if (Array.isArray(v)) return `[${v.map(write).join(",")}]`;
    if (v !== null && typeof v === "object") {
      const o = v as Record<string, unknown>;
      return `{${Object.keys(o)
        .sort()
        .map((k) => `${JSON.stringify(k)}:${write(o[k])}`)
        .join(",")}}`;
    }
    return JSON.stringify(v);
  };
  return write(plain);
}
