// Plain-text-first e-mails. Each template takes only what it shows.
export interface RenderedMail {
  subject: string;
  text: string;
}

export const mailTemplates = {
  invitation(d: { name: string; organisationName: string; inviterName: string; link: string; expiresHours: number }): RenderedMail {
    return {
      subject: `You are invited to Dewline by ${d.organisationName}`,
      text: [
        `Hello ${d.name},`,
        "",
        `${d.inviterName} of ${d.organisationName} has invited you to Dewline, where reports of damp, condensation and mould in your home are recorded and followed up.`,
        "",
        "Choose your password here:",
        d.link,
        "",
        `The link works once and expires in ${d.expiresHours} hours. If you were not expecting this e-mail you can ignore it.`,
      ].join("\n"),
    };
  },
  passwordReset(d: { name: string; link: string; expiresMinutes: number }): RenderedMail {
    return {
      subject: "Reset your Dewline password",
      text: [
        `Hello ${d.name},`,
        "",
        "Someone asked to reset the password of your Dewline account. To choose a new one, open:",
        d.link,
        "",
        `The link works once and expires in ${d.expiresMinutes} minutes. If you did not ask for this, ignore this e-mail: your password stays as it is.`,
      ].join("\n"),
    };
  },
} as const;

export type MailTemplateName = keyof typeof mailTemplates;
