import nodemailer from "nodemailer";
import type { Config } from "../config/env.js";

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** `encoding: "base64"`: `content` is the file in base64 (a PDF); otherwise it is the text itself. */
  attachments?: { filename: string; content: string; contentType: string; encoding?: "base64" }[];
  /** The Message-ID header to send (the outbox row's delivery key); nodemailer makes one up when absent. */
  messageId?: string;
}

export interface Mailer {
  send(message: MailMessage): Promise<{ messageId: string }>;
  close(): void;
}

/**
 * SMTP through nodemailer. Locally this reaches the mail catcher; in production, the landlord's relay.
 * Every call is bounded by the configured timeouts (connect, greeting, silence on the socket).
 */
export function createMailer(config: Pick<Config, "env" | "smtp" | "smtpTimeouts">): Mailer {
  const transport = nodemailer.createTransport({
    host: config.smtp.host,
    port: config.smtp.port,
    secure: false,
    // The local catcher speaks plain SMTP on loopback only.
    ignoreTLS: config.env !== "production",
    connectionTimeout: config.smtpTimeouts.connectionMs,
    greetingTimeout: config.smtpTimeouts.greetingMs,
    socketTimeout: config.smtpTimeouts.socketMs,
  });
  return {
    async send(message) {
      // The timeouts above bound each wait for the server, not the whole exchange: a server that keeps
      // the connection alive without finishing could still hold a send (and the relay behind it)
      // indefinitely. So the whole send has a deadline too; a late success is sent again later under
      // the same Message-ID (see mail.relay.ts).
      const deadlineMs = config.smtpTimeouts.connectionMs + config.smtpTimeouts.greetingMs + config.smtpTimeouts.socketMs;
      let timer: NodeJS.Timeout | undefined;
      const deadline = new Promise<never>((_, reject) => {
        timer = setTimeout(
          () => reject(new Error(`The mail server did not finish within ${Math.round(deadlineMs / 1000)} s.`)),
          deadlineMs,
        );
      });
      try {
        const info = await Promise.race([transport.sendMail({ from: config.smtp.from, ...message }), deadline]);
        return { messageId: info.messageId };
      } finally {
        clearTimeout(timer);
      }
    },
    close() {
      transport.close();
    },
  };
}
