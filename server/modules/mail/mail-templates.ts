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
  caseAcknowledgement(d: { name: string; reference: string; address: string; link: string; organisationName: string }): RenderedMail {
    return {
      subject: `We have your report ${d.reference}`,
      text: [
        `Hello ${d.name},`,
        "",
        `Thank you for telling us about damp or mould at ${d.address}. Your reference is ${d.reference}.`,
        "",
        `What happens next: ${d.organisationName} will look into every report, whatever any readings show. An officer will review it and contact you about an inspection. You can follow the case, add photos or readings, and tell us if it gets worse at:`,
        d.link,
        "",
        "If water is coming through a ceiling near lights or sockets, or you smell gas, call your landlord's emergency line straight away.",
      ].join("\n"),
    };
  },
  caseAlert(d: { reference: string; address: string; reasons: string[]; link: string }): RenderedMail {
    return {
      subject: `Priority damp report ${d.reference}: ${d.address}`,
      text: [
        `A new damp or mould report, ${d.reference} at ${d.address}, needs prompt attention:`,
        "",
        ...d.reasons.map((r) => `- ${r}`),
        "",
        d.link,
      ].join("\n"),
    };
  },
  caseMessage(d: { name: string; reference: string; senderName: string; body: string; link: string }): RenderedMail {
    return {
      subject: `A message about your report ${d.reference}`,
      text: [`Hello ${d.name},`, "", `${d.senderName} wrote about your report ${d.reference}:`, "", d.body, "", "You can reply and follow the case at:", d.link].join("\n"),
    };
  },
  writtenSummary(d: { name: string; reference: string; body: string; link: string }): RenderedMail {
    return {
      subject: `What we found and what happens next: ${d.reference}`,
      text: [`Hello ${d.name},`, "", d.body, "", "The summary is also on your case page:", d.link].join("\n"),
    };
  },
} as const;

export type MailTemplateName = keyof typeof mailTemplates;
