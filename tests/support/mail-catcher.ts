// An in-process SMTP server that keeps what it receives, so tests can read the e-mails the app sent.
// It can be stopped and started again on the same port (a mail-server outage), and a "hanging" server
// accepts connections and never answers (a stalled mail server).
import net from "node:net";
import { SMTPServer } from "smtp-server";

export interface CaughtMail {
  to: string[];
  subject: string;
  /** The Message-ID header as sent (the outbox row's delivery key). */
  messageId: string;
  /** The whole message, headers unfolded and parts decoded. */
  raw: string;
  /** The decoded text/plain part alone (every e-mail also has an HTML part, which repeats the words). */
  text: string;
  /** The decoded text/html part, or "" when there is none. */
  html: string;
}

/** One decoded part of the message by its content type: from after its headers to the next MIME boundary. */
function partOf(decoded: string, type: string): string {
  const at = decoded.search(new RegExp(`^Content-Type: ${type}`, "mi"));
  if (at < 0) return "";
  const rest = decoded.slice(at);
  const start = rest.search(/\r?\n\r?\n/);
  const body = rest.slice(start).replace(/^\r?\n\r?\n/, "");
  const end = body.search(/\r?\n--[^\r\n]+/);
  return end < 0 ? body : body.slice(0, end);
}

export interface MailCatcher {
  port: number;
  mails: CaughtMail[];
  /**
   * The newest e-mail to this address, once the app's relay has sent everything due (see `settle`),
   * waiting briefly for it to arrive.
   */
  lastTo(address: string, timeoutMs?: number): Promise<CaughtMail>;
  /** Resolves when the app sending here has nothing in flight (createTestApp sets it to its relay's idle()). */
  settle: () => Promise<void>;
  /** Stops listening (connections are refused, as from a mail server that is down); `start` listens again on the same port. */
  stop(): Promise<void>;
  start(): Promise<void>;
  close(): Promise<void>;
}

function decode(raw: string): string {
  // Unfold headers and decode quoted-printable soft breaks so tests can search the text.
  // Base64 parts (nodemailer's choice for text with many non-ASCII characters) are decoded in place.
  return raw
    .replace(/=\r?\n/g, "")
    .replace(/=3D/g, "=")
    .replace(
      /(Content-Transfer-Encoding: base64\r?\n(?:[^\r\n]+\r?\n)*\r?\n)([A-Za-z0-9+/=\r\n]+)/g,
      (_, head: string, body: string) => head + Buffer.from(body.replace(/\s+/g, ""), "base64").toString("utf8") + "\r\n",
    );
}

export async function startMailCatcher(options: { port?: number } = {}): Promise<MailCatcher> {
  const mails: CaughtMail[] = [];
  const make = () =>
    new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS", "AUTH"],
      logger: false,
      onData(stream, session, callback) {
        const chunks: Buffer[] = [];
        stream.on("data", (c: Buffer) => chunks.push(c));
        stream.on("end", () => {
          const raw = Buffer.concat(chunks).toString("utf8");
          const subject = /^Subject: (.*)$/m.exec(raw)?.[1]?.trim() ?? "";
          const messageId = /^Message-ID: *(.*)$/im.exec(raw.replace(/\r?\n[ \t]+/g, " "))?.[1]?.trim() ?? "";
          const decoded = decode(raw);
          mails.push({
            to: session.envelope.rcptTo.map((r) => r.address),
            subject,
            messageId,
            raw: decoded,
            text: partOf(decoded, "text/plain"),
            html: partOf(decoded, "text/html"),
          });
          callback();
        });
      },
    });
  let server: SMTPServer | null = null;
  let port = options.port ?? 0;
  const listen = async () => {
    server = make();
    const s = server;
    await new Promise<void>((resolve, reject) => {
      s.server.once("error", reject);
      s.listen(port, "127.0.0.1", () => resolve());
    });
    const address = s.server.address();
    port = typeof address === "object" && address ? address.port : port;
  };
  const stop = async () => {
    const s = server;
    server = null;
    if (s) await new Promise<void>((resolve) => s.close(() => resolve()));
  };
  await listen();
  const catcher: MailCatcher = {
    get port() {
      return port;
    },
    mails,
    settle: async () => undefined,
    async lastTo(to, timeoutMs = 20_000) {
      await catcher.settle();
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        const found = mails.filter((m) => m.to.includes(to)).at(-1);
        if (found) return found;
        if (Date.now() > deadline) throw new Error(`No e-mail to ${to} arrived`);
        await new Promise((r) => setTimeout(r, 25));
      }
    },
    stop,
    start: listen,
    close: stop,
  };
  return catcher;
}

/** A mail server that accepts connections and never says a word. */
export interface HangingSmtp {
  port: number;
  /** Connections accepted so far (each one is a send waiting for a greeting). */
  accepted: number;
  close(): Promise<void>;
}

export async function startHangingSmtp(): Promise<HangingSmtp> {
  const sockets = new Set<net.Socket>();
  const state = { accepted: 0 };
  const server = net.createServer((socket) => {
    state.accepted += 1;
    sockets.add(socket);
    socket.on("close", () => sockets.delete(socket));
    socket.on("error", () => undefined);
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
  const address = server.address();
  return {
    port: typeof address === "object" && address ? address.port : 0,
    get accepted() {
      return state.accepted;
    },
    close: async () => {
      for (const s of sockets) s.destroy();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
