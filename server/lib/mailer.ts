import nodemailer from "nodemailer";
import type { Config } from "../config/env.js";

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: string; contentType: string }[];
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
      const info = await transport.sendMail({ from: config.smtp.from, ...message });
      return { messageId: info.messageId };
    },
    close() {
      transport.close();
    },
  };
}
