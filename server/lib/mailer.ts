import nodemailer from "nodemailer";
import type { Config } from "../config/env.js";

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: string; contentType: string }[];
}

export interface Mailer {
  send(message: MailMessage): Promise<{ messageId: string }>;
  close(): void;
}

/** SMTP through nodemailer. Locally this reaches the mail catcher; in production, the landlord's relay. */
export function createMailer(config: Config): Mailer {
  const transport = nodemailer.createTransport({
    host: config.smtp.host,
    port: config.smtp.port,
    secure: false,
    // The local catcher speaks plain SMTP on loopback only.
    ignoreTLS: config.env !== "production",
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10000,
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
