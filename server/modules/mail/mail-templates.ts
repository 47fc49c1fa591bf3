// Plain-text-first e-mails. Each template takes only what it shows. Those a tenant may receive take the
// recipient's translator too (server/lib/i18n.ts: English, Welsh; the words live in server/locales/<lng>/mail.ts);
// the staff ones stay English and ignore it.
import type { Translate } from "../../lib/i18n.js";

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
const emergencyLine = (t: Translate, organisationName: string | undefined, phone: string | null | undefined): string =>
  organisationName
    ? t(phone ? "emergency.namedWithPhone" : "emergency.named", { organisationName, phone })
    : t(phone ? "emergency.withPhone" : "emergency.plain", { phone });

/** A visit's window on its London day, in the recipient's language ("Tuesday, 8 December 2026, morning, 8am to 12 noon"). */
export interface Slot {
  /** The London calendar date, YYYY-MM-DD. */
  date: string;
  window: "am" | "pm" | "all-day";
}

/** What one room's sensor saw, worded in the tenant's language by the e-mail (never suggesting blame). */
export interface SensorFinding {
  /** The room's name as the landlord keeps it; null when the room is not known. */
  room: string | null;
  rule: string;
  hoursAt80: number;
  condensingDays: number;
}

const SENSOR_RULES = new Set(["hours-at-80", "condensing-days"]);

const findingWords = (t: Translate, f: SensorFinding): string =>
  t(`sensorFinding.${SENSOR_RULES.has(f.rule) ? f.rule : "other"}`, {
    room: f.room ?? t("sensorFinding.aRoom"),
    hours: Math.round(f.hoursAt80),
    days: f.condensingDays,
  });

/** The kind of work (a work order's type) in the recipient's words. */
export const workWords = (t: Translate, workType: string): string => t(`mail:work.${workType}`);

/** The slot in the recipient's words; noon UTC is the same calendar day in London all year. */
export const slotWords = (t: Translate, slot: Slot): string =>
  t(`mail:slot.${slot.window}`, { day: new Date(`${slot.date}T12:00:00Z`) });

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
  invitation(
    d: { name: string; organisationName: string; inviterName: string; link: string; expiresHours: number },
    t: Translate,
  ): RenderedMail {
    return {
      subject: t("invitation.subject", d),
      text: [
        t("hello", d),
        "",
        t("invitation.body", d),
        "",
        t("choosePassword"),
        d.link,
        "",
        t("invitation.expires", { hours: d.expiresHours }),
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
  passwordReset(d: { name: string; link: string; expiresMinutes: number }, t: Translate): RenderedMail {
    return {
      subject: t("passwordReset.subject"),
      text: [
        t("hello", d),
        "",
        t("passwordReset.body"),
        d.link,
        "",
        t("passwordReset.expires", { minutes: d.expiresMinutes }),
      ].join("\n"),
    };
  },
  signInUnlock(d: { name: string; link: string; expiresMinutes: number }, t: Translate): RenderedMail {
    return {
      subject: t("signInUnlock.subject"),
      text: [
        t("hello", d),
        "",
        t("signInUnlock.attempts"),
        "",
        t("signInUnlock.wait"),
        d.link,
        "",
        t("signInUnlock.expires", { minutes: d.expiresMinutes }),
      ].join("\n"),
    };
  },
  invitationAddressInUse(d: { organisationName: string; inviterName: string }, t: Translate): RenderedMail {
    return {
      subject: t("invitationAddressInUse.subject", d),
      text: [t("helloPlain"), "", t("invitationAddressInUse.body", d), "", t("invitationAddressInUse.next", d)].join("\n"),
    };
  },
  caseAcknowledgement(
    d: {
      name: string;
      reference: string;
      address: string;
      link: string;
      organisationName: string;
      /** The landlord's emergency line from its policy; null when not set. */
      emergencyPhone?: string | null;
    },
    t: Translate,
  ): RenderedMail {
    return {
      subject: t("caseAcknowledgement.subject", d),
      text: [
        t("hello", d),
        "",
        t("caseAcknowledgement.thanks", d),
        "",
        t("caseAcknowledgement.next", d),
        d.link,
        "",
        t("waterNearElectrics", { emergency: emergencyLine(t, d.organisationName, d.emergencyPhone) }),
        // The national gas emergency line for Great Britain (from memory), not the landlord's.
        t("gas"),
      ].join("\n"),
    };
  },
  /**
   * To the tenant when the landlord opens a case from its sensors' readings: what the sensor saw, that
   * the landlord will be in touch, and the usual cautions. It never suggests the household caused it.
   */
  sensorCaseNotice(
    d: {
      name: string;
      reference: string;
      address: string;
      /** What each room's sensor saw; one line each, in the tenant's words. */
      findings: SensorFinding[];
      link: string;
      organisationName: string;
      emergencyPhone?: string | null;
    },
    t: Translate,
  ): RenderedMail {
    return {
      subject: t("sensorCaseNotice.subject", d),
      text: [
        t("hello", d),
        "",
        t("sensorCaseNotice.opened", d),
        "",
        t("sensorCaseNotice.saw"),
        ...[...new Set(d.findings.map((f) => findingWords(t, f)))].map((f) => `- ${f}`),
        "",
        t("sensorCaseNotice.next", d),
        d.link,
        "",
        t("mouldCaution"),
        t("waterNearElectrics", { emergency: emergencyLine(t, d.organisationName, d.emergencyPhone) }),
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
  complaintLetter(d: { name: string; subject: string; body: string }, t: Translate): RenderedMail {
    return { subject: d.subject, text: [t("hello", d), "", withoutGreeting(d.body)].join("\n") };
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
  caseMessage(
    d: { name: string; reference: string; senderName: string; body: string; link: string },
    t: Translate,
  ): RenderedMail {
    return {
      subject: t("caseMessage.subject", d),
      text: [t("hello", d), "", t("caseMessage.wrote", d), "", d.body, "", t("caseMessage.reply"), d.link].join("\n"),
    };
  },
  writtenSummary(
    d: {
      name: string;
      reference: string;
      body: string;
      link: string;
      organisationName?: string;
      /** The landlord's emergency line from its policy; null when not set. */
      emergencyPhone?: string | null;
    },
    t: Translate,
  ): RenderedMail {
    return {
      subject: t("writtenSummary.subject", d),
      text: [
        t("hello", d),
        "",
        withoutGreeting(d.body),
        "",
        t("writtenSummary.emergency", { emergency: emergencyLine(t, d.organisationName, d.emergencyPhone) }),
        "",
        t("writtenSummary.onPage"),
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
  appointmentProposed(
    d: {
      name: string;
      reference: string;
      /** The work order's type; the template words it in the recipient's language. */
      workType: string;
      slot: Slot;
      address: string;
      link: string;
      ics: string;
      forOperative: boolean;
      accessNotes: string | null;
      /** The visit moved from an earlier booking. */
      rescheduled?: boolean;
    },
    t: Translate,
  ): RenderedMail {
    const words = { ...d, work: workWords(t, d.workType), slot: slotWords(t, d.slot) };
    const variant = d.forOperative ? "operative" : d.rescheduled ? "rescheduled" : "proposed";
    return {
      subject: t(`appointmentProposed.subject.${variant}`, words),
      text: [
        t("hello", d),
        "",
        t(`appointmentProposed.body.${variant}`, words),
        ...(d.forOperative ? [] : [d.link]),
        ...(d.forOperative && d.accessNotes ? ["", t("appointmentProposed.accessNotes", { notes: d.accessNotes })] : []),
        "",
        t("appointment.calendarAttached"),
      ].join("\n"),
      attachments: calendarFile(d.ics),
    };
  },
  appointmentConfirmed(
    d: { name: string; reference: string; workType: string; slot: Slot; address: string; link: string; ics: string },
    t: Translate,
  ): RenderedMail {
    const words = { ...d, work: workWords(t, d.workType), slot: slotWords(t, d.slot) };
    return {
      subject: t("appointmentConfirmed.subject", words),
      text: [t("hello", d), "", t("appointmentConfirmed.body", words), d.link, "", t("appointment.calendarAttached")].join("\n"),
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
  appointmentCancelled(
    d: {
      name: string;
      reference: string;
      workType: string;
      slot: Slot;
      address: string;
      reason: string;
      link: string;
      ics: string;
    },
    t: Translate,
  ): RenderedMail {
    const words = { ...d, work: workWords(t, d.workType), slot: slotWords(t, d.slot) };
    return {
      subject: t("appointmentCancelled.subject", words),
      text: [
        t("hello", d),
        "",
        t("appointmentCancelled.body", words),
        t("appointmentCancelled.reason", d),
        d.link,
        "",
        t("appointmentCancelled.calendar"),
      ].join("\n"),
      attachments: [{ filename: "appointment.ics", content: d.ics, contentType: "text/calendar; charset=utf-8; method=CANCEL" }],
    };
  },
  monitoringStarted(
    d: { name: string; reference: string; days: number; endsAt: Date; link: string },
    t: Translate,
  ): RenderedMail {
    return {
      subject: t("monitoringStarted.subject", d),
      text: [t("hello", d), "", t("monitoringStarted.body", d), t("monitoringStarted.readings"), d.link].join("\n"),
    };
  },
  fixConfirmed(d: { name: string; reference: string; link: string }, t: Translate): RenderedMail {
    return {
      subject: t("fixConfirmed.subject", d),
      text: [t("hello", d), "", t("fixConfirmed.body", d), t("fixConfirmed.comesBack"), d.link].join("\n"),
    };
  },
  monitoringEnded(
    d: { name: string; reference: string; link: string; forLead: boolean; readingsAfter: number },
    t: Translate,
  ): RenderedMail {
    // The lead's e-mail is staff text, in English; the tenant's is in their language.
    return {
      subject: d.forLead ? `Monitoring ended, decide if the fix worked: ${d.reference}` : t("monitoringEnded.subject", d),
      text: d.forLead
        ? [
            `Hello ${d.name},`,
            "",
            `The monitoring period for ${d.reference} has ended with ${d.readingsAfter} readings after the works. Compare before and after and record whether the fix worked:`,
            d.link,
          ].join("\n")
        : [t("hello", d), "", t("monitoringEnded.body", d), d.link].join("\n"),
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
