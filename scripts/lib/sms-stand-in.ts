// A local stand-in for the hosted text-message API that `notifications-node-client` talks to: the one
// call Dewline makes (POST /v2/notifications/sms), checked the way the real service checks it (a Bearer
// JWT, HS256, `iss` = the service id, signed with the key's secret part; a UK mobile number; a known
// template), answered 201 with the same shape. What it accepted is kept in memory and shown at GET /
// (a small page) and GET /messages (JSON), so a developer can read the texts like the mail catcher's.
import { createHmac, randomUUID, timingSafeEqual } from "node:crypto";
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { normaliseUkMobile } from "../../src/lib/domain/uk-mobile.js";

export interface SmsStandInMessage {
  id: string;
  to: string;
  templateId: string;
  reference: string | null;
  body: string;
  receivedAt: string;
}

export interface SmsStandIn {
  /** The base URL the SDK is pointed at, e.g. http://127.0.0.1:18970 (SMS_BASE_URL). */
  url: string;
  port: number;
  /** Texts accepted so far, oldest first. */
  messages(): SmsStandInMessage[];
  /** Every call's Authorization header checked so far (valid or not), for tests. */
  checkedTokens(): { valid: boolean; iss: string | null }[];
  /** From now on, answer every send with this status (500: the provider is down); null: back to normal. */
  failWith(status: number | null): void;
  close(): Promise<void>;
}

export interface SmsStandInOptions {
  port?: number;
  host?: string;
  /** The API key the app uses: `name-<service id>-<secret>` (both UUIDs). */
  apiKey: string;
  /** The one template the app sends through (its body is `((body))`). */
  templateId: string;
}

/** The service id and secret inside an API key, as the SDK reads them (the last 73 characters). */
export function keyParts(apiKey: string): { serviceId: string; secret: string } {
  return { serviceId: apiKey.slice(-73, -37), secret: apiKey.slice(-36) };
}

const b64url = (s: string) => Buffer.from(s, "base64url");

/** The JWT's `iss` when its signature (HS256 with `secret`) holds and `iat` is within 30 s of now; null otherwise. */
function verifiedIssuer(header: string | undefined, secret: string): string | null {
  const token = /^Bearer (\S+)$/.exec(header ?? "")?.[1];
  const parts = token?.split(".");
  if (!parts || parts.length !== 3) return null;
  try {
    const head = JSON.parse(b64url(parts[0]!).toString("utf8")) as { alg?: string };
    if (head.alg !== "HS256") return null;
    const expected = createHmac("sha256", secret).update(`${parts[0]}.${parts[1]}`).digest();
    const given = b64url(parts[2]!);
    if (given.length !== expected.length || !timingSafeEqual(given, expected)) return null;
    const claims = JSON.parse(b64url(parts[1]!).toString("utf8")) as { iss?: string; iat?: number };
    // The real service refuses tokens more than 30 seconds from its own clock.
    if (typeof claims.iat !== "number" || Math.abs(Date.now() / 1000 - claims.iat) > 30) return null;
    return typeof claims.iss === "string" ? claims.iss : null;
  } catch {
    return null;
  }
}

const escapeHtml = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

function send(res: ServerResponse, status: number, body: unknown, type = "application/json") {
  res.writeHead(status, { "content-type": `${type}; charset=utf-8` });
  res.end(typeof body === "string" ? body : JSON.stringify(body));
}

const error = (res: ServerResponse, status: number, kind: string, message: string) =>
  send(res, status, { status_code: status, errors: [{ error: kind, message }] });

async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString("utf8");
}

export async function startSmsStandIn(options: SmsStandInOptions): Promise<SmsStandIn> {
  const { serviceId, secret } = keyParts(options.apiKey);
  const messages: SmsStandInMessage[] = [];
  const tokens: { valid: boolean; iss: string | null }[] = [];
  let failure: number | null = null;

  const page = () => {
    const rows = [...messages]
      .reverse()
      .map(
        (m) =>
          `<tr><td>${escapeHtml(m.receivedAt)}</td><td>${escapeHtml(m.to)}</td><td style="white-space: pre-wrap">${escapeHtml(m.body)}</td></tr>`,
      )
      .join("\n");
    return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Text messages (local stand-in)</title></head>
<body style="font-family: sans-serif"><h1>Text messages sent (local stand-in)</h1>
<p>${messages.length} received. Newest first. JSON at <a href="/messages">/messages</a>.</p>
<table border="1" cellpadding="6"><thead><tr><th>Received</th><th>To</th><th>Text</th></tr></thead><tbody>
${rows}
</tbody></table></body></html>`;
  };

  const server = createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? "/", "http://stand-in");
      if (req.method === "GET" && url.pathname === "/") return send(res, 200, page(), "text/html");
      if (req.method === "GET" && url.pathname === "/messages") return send(res, 200, messages);
      if (req.method !== "POST" || url.pathname !== "/v2/notifications/sms") return error(res, 404, "NotFound", "Not found");
      const raw = await readBody(req);
      const iss = verifiedIssuer(req.headers.authorization, secret);
      tokens.push({ valid: iss === serviceId, iss });
      if (iss !== serviceId) return error(res, 403, "AuthError", "Invalid token: API key not found");
      if (failure !== null) return error(res, failure, "Exception", "Internal server error");
      let body: { template_id?: unknown; phone_number?: unknown; personalisation?: { body?: unknown }; reference?: unknown };
      try {
        body = JSON.parse(raw) as typeof body;
      } catch {
        return error(res, 400, "ValidationError", "Request body is not valid JSON");
      }
      const phone = typeof body.phone_number === "string" ? normaliseUkMobile(body.phone_number) : null;
      if (!phone) return error(res, 400, "ValidationError", "phone_number Not a UK mobile number");
      if (body.template_id !== options.templateId) return error(res, 400, "BadRequestError", "Template not found");
      const text = body.personalisation?.body;
      if (typeof text !== "string" || !text.trim()) return error(res, 400, "BadRequestError", "Missing personalisation: body");
      const id = randomUUID();
      const reference = typeof body.reference === "string" ? body.reference : null;
      messages.push({
        id,
        to: phone,
        templateId: options.templateId,
        reference,
        body: text,
        receivedAt: new Date().toISOString(),
      });
      const base = `http://${req.headers.host ?? "127.0.0.1"}`;
      return send(res, 201, {
        id,
        reference,
        content: { body: text, from_number: "Dewline" },
        uri: `${base}/v2/notifications/${id}`,
        template: { id: options.templateId, version: 1, uri: `${base}/services/${serviceId}/templates/${options.templateId}` },
      });
    })().catch((e: unknown) => error(res, 500, "Exception", e instanceof Error ? e.message : String(e)));
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 0, options.host ?? "127.0.0.1", () => resolve());
  });
  const { port, address } = server.address() as AddressInfo;
  return {
    url: `http://${address.includes(":") ? `[${address}]` : address}:${port}`,
    port,
    messages: () => [...messages],
    checkedTokens: () => [...tokens],
    failWith(status) {
      failure = status;
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/**
 * Starts the stand-in where SMS_BASE_URL points, when that is this machine (npm start, npm run dev);
 * null when it points elsewhere (a real provider) or the port is taken (another copy is running).
 */
export async function startSmsStandInAt(
  config: { baseUrl: string; apiKey: string; templateId: string },
  warn: (line: string) => void = console.warn,
): Promise<SmsStandIn | null> {
  const url = new URL(config.baseUrl);
  if (!["127.0.0.1", "localhost", "[::1]"].includes(url.hostname)) return null;
  const port = Number(url.port || 80);
  try {
    return await startSmsStandIn({
      port,
      host: url.hostname === "[::1]" ? "::1" : "127.0.0.1",
      apiKey: config.apiKey,
      templateId: config.templateId,
    });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== "EADDRINUSE") throw error;
    warn(
      `Port ${port} is taken, so the local text-message stand-in was not started; texts go to whatever answers at ${config.baseUrl}.`,
    );
    return null;
  }
}
