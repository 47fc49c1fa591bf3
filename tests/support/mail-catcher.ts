// An in-process SMTP server that keeps what it receives, so tests can read the e-mails the app sent.
import { SMTPServer } from "smtp-server";

export interface CaughtMail {
  to: string[];
  subject: string;
  raw: string;
}

export interface MailCatcher {
  port: number;
  mails: CaughtMail[];
  /** The newest e-mail to this address, waiting briefly for it to arrive. */
  lastTo(address: string, timeoutMs?: number): Promise<CaughtMail>;
  close(): Promise<void>;
}

export async function startMailCatcher(): Promise<MailCatcher> {
  const mails: CaughtMail[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        const raw = Buffer.concat(chunks).toString("utf8");
        // Unfold headers and decode quoted-printable soft breaks so tests can search the text.
        // Base64 parts (nodemailer's choice for text with many non-ASCII characters) are decoded in place.
        const decoded = raw
          .replace(/=\r?\n/g, "")
          .replace(/=3D/g, "=")
          .replace(
            /(Content-Transfer-Encoding: base64\r?\n(?:[^\r\n]+\r?\n)*\r?\n)([A-Za-z0-9+/=\r\n]+)/g,
            (_, head: string, body: string) => head + Buffer.from(body.replace(/\s+/g, ""), "base64").toString("utf8") + "\r\n",
          );
        const subject = /^Subject: (.*)$/m.exec(raw)?.[1]?.trim() ?? "";
        mails.push({ to: session.envelope.rcptTo.map((r) => r.address), subject, raw: decoded });
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
  const address = server.server.address();
  const port = typeof address === "object" && address ? address.port : 0;
  return {
    port,
    mails,
    async lastTo(to, timeoutMs = 20_000) {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        const found = mails.filter((m) => m.to.includes(to)).at(-1);
        if (found) return found;
        if (Date.now() > deadline) throw new Error(`No e-mail to ${to} arrived`);
        await new Promise((r) => setTimeout(r, 25));
      }
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
