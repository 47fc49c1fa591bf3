// Plain-text-first e-mails. Each template takes only what it shows.
export interface MailAttachment {
  filename: string;
  /** The text, or with `encoding: "base64"` the file's bytes in base64. */
  content: string;
  contentType: string;
  encoding?: "base64";
}

export interface RenderedMail {
  subject: string;
  text: string;
  /** An HTML version; when a template gives none, one is made from the text (htmlFromText). */
  html?: string;
  attachments?: MailAttachment[];
}

const escapeHtml = (s: string): string =>
  s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");

/**
 * The text as simple HTML: paragraphs at blank lines, line breaks kept, links clickable. Everything
 * is escaped first, so words a tenant or officer typed can never become markup in someone's mail client.
 */
export function htmlFromText(text: string): string {
  const paragraphs = text
    .split(/\n{2,}/)
    .map((p) =>
      escapeHtml(p)
        .replace(/https?:\/\/[^\s<]+/g, (url) => `<a href="${url}">${url}</a>`)
        .replace(/\n/g, "<br>\n"),
    )
    .map((p) => `<p>${p}</p>`);
  return `<!doctype html>\n<html><body style="font-family: sans-serif; line-height: 1.5">\n${paragraphs.join("\n")}\n</body></html>`;
}

/** The sentence giving the landlord's emergency line, with its number when the landlord has set one in its policy. */
const emergencyLine = (organisationName: string | undefined, phone: string | null | undefined): string => {
  const whose = organisationName ? `the ${organisationName}` : "your landlord's";
  return phone
    ? `call ${whose} emergency line straight away on ${phone}.`
    : `call ${whose} emergency line straight away (the number is on your tenancy agreement).`;
};

/**
 * A letter's text without a greeting of its own: the e-mail greets the tenant once, by name, so a
 * "Hello…," or "Dear…," first line in the body is left out.
 */
const withoutGreeting = (body: string): string =>
  body.replace(/^\s*(?:hello|hi|dear)\b[^\n]{0,80},[ \t]*(?:\r?\n)+/i, "").trimStart();

const calendarFile = (ics: string): MailAttachment[] => [
  { filename: "appointment.ics", content: ics, contentType: "text/calendar; charset=utf-8; method=REQUEST" },
];

export const mailTemplates = {
  invitation(d: {
    name: string;
    organisationName: string;
    inviterName: string;
    link: string;
    expiresHours: number;
  }): RenderedMail {
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
  /** For officers, maintenance leads and administrators: about the landlord's homes, never "your home". */
  staffInvitation(d: {
    name: string;
    organisationName: string;
    inviterName: string;
    roleLabel: string;
    link: string;
    expiresHours: number;
  }): RenderedMail {
    return {
      subject: `You are invited to join ${d.organisationName}'s team on Dewline`,
      text: [
        `Hello ${d.name},`,
        "",
        `${d.inviterName} has added you to ${d.organisationName}'s team on Dewline, as ${/^[AEIOU]/.test(d.roleLabel) ? "an" : "a"} ${d.roleLabel.toLowerCase()}.`,
        "Dewline is where the team receives tenants' reports of damp, condensation and mould in the homes the organisation manages, and follows each one through inspection, repairs and checks afterwards.",
        "",
        "Choose your password here:",
        d.link,
        "",
        `The link works once and expires in ${d.expiresHours} hours. If you were not expecting this e-mail, you can ignore it and no account will be opened.`,
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
  signInUnlock(d: { name: string; link: string; expiresMinutes: number }): RenderedMail {
    return {
      subject: "Signing in to Dewline",
      text: [
        `Hello ${d.name},`,
        "",
        "There have been several unsuccessful attempts to sign in to your Dewline account, or someone asked us for this link. It may have been you; someone may have been trying to guess your password. Your account is safe and has not been locked.",
        "",
        "While the attempts go on, Dewline asks for a short wait between tries. To skip the wait in your own browser, open this link there, then sign in as usual:",
        d.link,
        "",
        `The link works once and expires in ${d.expiresMinutes} minutes. If you do not know your password any more, use "Forgot your password?" on the sign-in page.`,
      ].join("\n"),
    };
  },
  invitationAddressInUse(d: { organisationName: string; inviterName: string }): RenderedMail {
    return {
      subject: `${d.organisationName} tried to invite you to Dewline`,
      text: [
        "Hello,",
        "",
        `${d.inviterName} at ${d.organisationName} tried to invite this e-mail address to Dewline. This address already has a Dewline account, and one address can only belong to one account, so nothing has been changed and no new account was opened.`,
        "",
        `If you expected this invitation, please tell ${d.organisationName} which other e-mail address they can invite you at. If you did not expect it, you can ignore this e-mail.`,
      ].join("\n"),
    };
  },
  caseAcknowledgement(d: {
    name: string;
    reference: string;
    address: string;
    link: string;
    organisationName: string;
    /** The landlord's emergency line from its policy; null when not set. */
    emergencyPhone?: string | null;
  }): RenderedMail {
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
        `If water is coming through a ceiling near lights or sockets, ${emergencyLine(d.organisationName, d.emergencyPhone)}`,
        // The national gas emergency line for Great Britain (from memory), not the landlord's.
        "If you smell gas, open the windows, do not use switches or flames, leave the home and call the gas emergency line on 0800 111 999.",
      ].join("\n"),
    };
  },
  /**
   * To the tenant when the landlord opens a case from its sensors' readings: what the sensor saw, that
   * the landlord will be in touch, and the usual cautions. It never suggests the household caused it.
   */
  sensorCaseNotice(d: {
    name: string;
    reference: string;
    address: string;
    /** Plain sentences about what the sensor saw, e.g. "The sensor in the Bedroom showed …". */
    findings: string[];
    link: string;
    organisationName: string;
    emergencyPhone?: string | null;
  }): RenderedMail {
    return {
      subject: `We are looking into damp at your home (${d.reference})`,
      text: [
        `Hello ${d.name},`,
        "",
        `The sensors ${d.organisationName} fitted at ${d.address} show conditions in which damp and mould can start, so we have opened a case to look into it. You do not need to do anything to start it, and nothing here says you have done anything wrong: damp like this usually comes from how a home is built, heated or ventilated, and it is ours to find the cause and put it right.`,
        "",
        "What the sensor saw:",
        ...d.findings.map((f) => `- ${f}`),
        "",
        `What happens next: an officer will contact you to arrange a visit. Your reference is ${d.reference}. You can follow the case, add photos and tell us anything you have noticed at:`,
        d.link,
        "",
        "Until then: if you see mould, do not scrape it dry or brush it, as that spreads spores. Anyone with asthma, allergies or a weak immune system, and babies, should keep away from it, and if anyone's breathing gets worse, speak to your GP or pharmacist.",
        `If water is coming through a ceiling near lights or sockets, ${emergencyLine(d.organisationName, d.emergencyPhone)}`,
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
  /** To the case's assignee (or the officers when nobody is assigned): the tenant says it has got worse. */
  caseWorse(d: {
    name: string;
    reference: string;
    address: string;
    note: string;
    reopened: boolean;
    link: string;
  }): RenderedMail {
    return {
      subject: `Got worse: ${d.reference}, ${d.address}`,
      text: [
        `Hello ${d.name},`,
        "",
        `The tenant of ${d.address} says the damp or mould reported in ${d.reference} has got worse. In their words:`,
        "",
        d.note,
        "",
        d.reopened
          ? "The case had been closed or was being monitored; it has been reopened and is back in the queue for triage."
          : "The case's priority has been worked out again with this in mind.",
        "",
        "Open the case:",
        d.link,
      ].join("\n"),
    };
  },
  /** A complaint letter, its subject and body already filled in from the landlord's wording (complaints module). */
  complaintLetter(d: { name: string; subject: string; body: string }): RenderedMail {
    return { subject: d.subject, text: [`Hello ${d.name},`, "", withoutGreeting(d.body)].join("\n") };
  },
  /** For the assignee, or every officer while nobody is assigned: a tenant made a formal complaint about a case. */
  complaintRaised(d: {
    name: string;
    reference: string;
    address: string;
    tenantName: string;
    description: string;
    /** The acknowledgement's due day, in words. */
    acknowledgeBy: string;
    link: string;
  }): RenderedMail {
    return {
      subject: `Formal complaint about ${d.reference}: acknowledge by ${d.acknowledgeBy}`,
      text: [
        `Hello ${d.name},`,
        "",
        `${d.tenantName}, the tenant at ${d.address}, made a formal complaint about case ${d.reference}:`,
        "",
        d.description,
        "",
        `Stage 1 is to be acknowledged by the end of ${d.acknowledgeBy}. The complaint and its clocks are on the case page:`,
        d.link,
      ].join("\n"),
    };
  },
  caseMessage(d: { name: string; reference: string; senderName: string; body: string; link: string }): RenderedMail {
    return {
      subject: `A message about your report ${d.reference}`,
      text: [
        `Hello ${d.name},`,
        "",
        `${d.senderName} wrote about your report ${d.reference}:`,
        "",
        d.body,
        "",
        "You can reply and follow the case at:",
        d.link,
      ].join("\n"),
    };
  },
  writtenSummary(d: {
    name: string;
    reference: string;
    body: string;
    link: string;
    organisationName?: string;
    /** The landlord's emergency line from its policy; null when not set. */
    emergencyPhone?: string | null;
  }): RenderedMail {
    return {
      subject: `What we found and what happens next: ${d.reference}`,
      text: [
        `Hello ${d.name},`,
        "",
        withoutGreeting(d.body),
        "",
        `In an emergency, such as water coming through a ceiling near lights or sockets, ${emergencyLine(d.organisationName, d.emergencyPhone)}`,
        "",
        "The summary is also on your case page:",
        d.link,
      ].join("\n"),
    };
  },
  deadlineDigest(d: {
    name: string;
    /** The London day the digest is for, in words ("Tuesday 3 December 2024"). */
    date: string;
    /** The end of the window, in words ("the end of Thursday 5 December 2024"). */
    windowEnd: string;
    /** Overdue first, then by due time. */
    items: {
      reference: string;
      address: string;
      stage: string;
      due: string;
      overdue: boolean;
      assignedToYou: boolean;
      link: string;
    }[];
    queueLink: string;
  }): RenderedMail {
    const overdue = d.items.filter((i) => i.overdue).length;
    const count = (n: number) => `${n} ${n === 1 ? "case" : "cases"}`;
    return {
      subject: `Deadlines for ${d.date}: ${count(d.items.length)}${overdue ? `, ${overdue} overdue` : ""}`,
      text: [
        `Hello ${d.name},`,
        "",
        `These damp and mould cases have a deadline that has passed or falls due by ${d.windowEnd} (the next two working days). Overdue cases come first.`,
        "",
        ...d.items.flatMap((i) => [
          `${i.overdue ? "OVERDUE: " : ""}${i.reference}, ${i.address}`,
          `  ${i.stage}: ${i.overdue ? `was due ${i.due}, and is now overdue` : `due ${i.due}`}`,
          `  ${i.assignedToYou ? "Assigned to you" : "Not assigned to anyone yet"}`,
          `  ${i.link}`,
          "",
        ]),
        "Every case with a deadline in the next two days, in the queue:",
        d.queueLink,
        "",
        "Times are UK time. Working days leave out weekends and bank holidays in England and Wales.",
      ].join("\n"),
    };
  },
  appointmentProposed(d: {
    name: string;
    reference: string;
    workWords: string;
    slotWords: string;
    address: string;
    link: string;
    ics: string;
    forOperative: boolean;
    accessNotes: string | null;
    /** The visit moved from an earlier booking. */
    rescheduled?: boolean;
  }): RenderedMail {
    return {
      subject: `${d.forOperative ? "Booked" : d.rescheduled ? "New time proposed" : "Proposed appointment"}: ${d.workWords}, ${d.slotWords} (${d.reference})`,
      text: [
        `Hello ${d.name},`,
        "",
        d.forOperative
          ? `You are booked for ${d.workWords} at ${d.address}, ${d.slotWords}. The tenant has been asked to confirm.`
          : d.rescheduled
            ? `The visit to ${d.address} for ${d.workWords} has moved. The new time is ${d.slotWords}. Please confirm it on your case page, or ask for another time if it does not suit you:`
            : `We would like to come to ${d.address} for ${d.workWords} on ${d.slotWords}. Please confirm on your case page, or ask for another time if this one does not suit you:`,
        ...(d.forOperative ? [] : [d.link]),
        ...(d.forOperative && d.accessNotes ? ["", `Access and household notes: ${d.accessNotes}`] : []),
        "",
        "The appointment is attached as a calendar file.",
      ].join("\n"),
      attachments: calendarFile(d.ics),
    };
  },
  appointmentConfirmed(d: {
    name: string;
    reference: string;
    workWords: string;
    slotWords: string;
    address: string;
    link: string;
    ics: string;
  }): RenderedMail {
    return {
      subject: `Confirmed: ${d.workWords}, ${d.slotWords} (${d.reference})`,
      text: [
        `Hello ${d.name},`,
        "",
        `The appointment for ${d.workWords} at ${d.address} is confirmed for ${d.slotWords}.`,
        d.link,
        "",
        "The appointment is attached as a calendar file.",
      ].join("\n"),
      attachments: calendarFile(d.ics),
    };
  },
  appointmentChangeRequested(d: {
    name: string;
    reference: string;
    workWords: string;
    slotWords: string;
    address: string;
    reason: string;
    link: string;
  }): RenderedMail {
    return {
      subject: `Another slot wanted: ${d.workWords} at ${d.address} (${d.reference})`,
      text: [
        `Hello ${d.name},`,
        "",
        `The tenant at ${d.address} cannot make ${d.slotWords} for ${d.workWords} and asks for another slot:`,
        `"${d.reason}"`,
        "",
        "Please book another slot:",
        d.link,
      ].join("\n"),
    };
  },
  appointmentCancelled(d: {
    name: string;
    reference: string;
    workWords: string;
    slotWords: string;
    address: string;
    reason: string;
    link: string;
    ics: string;
  }): RenderedMail {
    return {
      subject: `Cancelled: ${d.workWords}, ${d.slotWords} (${d.reference})`,
      text: [
        `Hello ${d.name},`,
        "",
        `The visit for ${d.workWords} at ${d.address} on ${d.slotWords} is cancelled.`,
        `Reason: ${d.reason}`,
        d.link,
        "",
        "The attached calendar file removes it from your calendar.",
      ].join("\n"),
      attachments: [{ filename: "appointment.ics", content: d.ics, contentType: "text/calendar; charset=utf-8; method=CANCEL" }],
    };
  },
  monitoringStarted(d: { name: string; reference: string; days: number; endsOn: string; link: string }): RenderedMail {
    return {
      subject: `Checking the repair worked: ${d.reference}`,
      text: [
        `Hello ${d.name},`,
        "",
        `The work on your report ${d.reference} is done. Over the next ${d.days} days, until ${d.endsOn}, we will check that the damp and mould have really stopped.`,
        "If you have a thermometer and humidity meter (hygrometer) or a data logger, please add readings on your case page now and then, in the rooms that were affected. Tell us at once if anything comes back:",
        d.link,
      ].join("\n"),
    };
  },
  fixConfirmed(d: { name: string; reference: string; link: string }): RenderedMail {
    return {
      subject: `The repair worked: ${d.reference} is closed`,
      text: [
        `Hello ${d.name},`,
        "",
        `We have checked the work on your report ${d.reference} and the damp and mould problem looks fixed, so we have closed the report.`,
        "If damp or mould comes back, open your case page and tell us it has got worse, or make a new report:",
        d.link,
      ].join("\n"),
    };
  },
  monitoringEnded(d: { name: string; reference: string; link: string; forLead: boolean; readingsAfter: number }): RenderedMail {
    return {
      subject: d.forLead ? `Monitoring ended, decide if the fix worked: ${d.reference}` : `Please add readings: ${d.reference}`,
      text: d.forLead
        ? [
            `Hello ${d.name},`,
            "",
            `The monitoring period for ${d.reference} has ended with ${d.readingsAfter} readings after the works. Compare before and after and record whether the fix worked:`,
            d.link,
          ].join("\n")
        : [
            `Hello ${d.name},`,
            "",
            `The monitoring period after the work on ${d.reference} has ended. If you have readings from the last few weeks, please add them now so we can see whether the damp has stopped, and tell us if the mould has come back:`,
            d.link,
          ].join("\n"),
    };
  },
  /** To the assignee, or to each officer while nobody is assigned: the tenant wrote on their case. */
  tenantMessage(d: {
    name: string;
    reference: string;
    address: string;
    tenantName: string;
    body: string;
    photoCount: number;
    assignedToYou: boolean;
    link: string;
  }): RenderedMail {
    const photos =
      d.photoCount === 0 ? [] : ["", d.photoCount === 1 ? "1 photo came with it." : `${d.photoCount} photos came with it.`];
    return {
      subject: `New message from the tenant on ${d.reference}`,
      text: [
        `Hello ${d.name},`,
        "",
        `${d.tenantName}, the tenant at ${d.address}, wrote on case ${d.reference}:`,
        "",
        d.body,
        ...photos,
        "",
        d.assignedToYou
          ? "You are the case's assignee. Read and reply on the case page:"
          : "Nobody is assigned to the case yet, so every officer gets this e-mail. Read and reply on the case page:",
        d.link,
      ].join("\n"),
    };
  },
  boardReport(d: { organisationName: string; monthWords: string; fileName: string; pdfBase64: string }): RenderedMail {
    return {
      subject: `${d.organisationName}: damp and mould board report, ${d.monthWords}`,
      text: [
        "Hello,",
        "",
        `The damp and mould board report of ${d.organisationName} for ${d.monthWords} is attached (PDF): the deadlines met and missed, the time taken to act, the Category 1 hazards open, and where cases cluster.`,
        "",
        "You get it because an administrator of the landlord put this address on the report's list. Ask them to take it off if it should not come to you.",
      ].join("\n"),
      attachments: [{ filename: d.fileName, content: d.pdfBase64, contentType: "application/pdf", encoding: "base64" }],
    };
  },
} as const;

export type MailTemplateName = keyof typeof mailTemplates;

/**
 * Templates whose e-mail carries a single-use secret (a sign-in, invitation or reset link). The
 * outbox forgets their text and HTML once sent, so the database never keeps a usable link (only its
 * hash is stored elsewhere), and staff cannot resend them: a new invitation or reset is the way.
 * A new template with such a link must be listed here.
 */
export const SECRET_TEMPLATES: ReadonlySet<string> = new Set<MailTemplateName>([
  "invitation",
  "staffInvitation",
  "passwordReset",
  "signInUnlock",
]);
