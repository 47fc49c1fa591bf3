// Reading age of the text tenants read (`npm run readability`): each namespace of src/locales/en-GB,
// the tenant e-mails and the text messages, by the Flesch-Kincaid grade (scripts/lib/readability.ts
// names the formula and its source). E-mails and texts are read from server/locales/en*/ when their
// words live there, otherwise rendered from server/modules/mail/mail-templates.ts and
// server/modules/sms/sms-texts.ts with sample values. Links and words people typed are left out.
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { mailTemplates } from "../server/modules/mail/mail-templates.js";
import { smsTexts } from "../server/modules/sms/sms-texts.js";
import { flattenMessages, icuToText, measureSource, type Message, type SourceReport } from "./lib/readability.js";
import { projectRoot } from "./lib/paths.js";

/** Messages of one JSON file of ICU messages. */
function jsonMessages(file: string): Message[] {
  return flattenMessages(JSON.parse(readFileSync(file, "utf8"))).map(([key, message]) => {
    let text: string;
    try {
      text = icuToText(message);
    } catch {
      text = message; // not ICU after all: read as it stands
    }
    return { key, text };
  });
}

/** The e-mails a tenant (or someone invited as one) receives, with sample values. */
const TENANT_MAILS: Record<string, Record<string, unknown>> = {
  invitation: { organisationName: "Brookfield Homes", inviterName: "Sam", expiresHours: 72 },
  passwordReset: { expiresMinutes: 60 },
  signInUnlock: { expiresMinutes: 30 },
  invitationAddressInUse: { organisationName: "Brookfield Homes", inviterName: "Sam" },
  caseAcknowledgement: { organisationName: "Brookfield Homes", address: "4 Elm Row", emergencyPhone: "0300 123 4567" },
  sensorCaseNotice: {
    organisationName: "Brookfield Homes",
    address: "4 Elm Row",
    findings: ["The sensor in the bedroom showed damp air for three days."],
  },
  caseMessage: { senderName: "Sam", body: "" },
  writtenSummary: { body: "", organisationName: "Brookfield Homes", emergencyPhone: "0300 123 4567" },
  appointmentProposed: { workWords: "Fan repair", slotWords: "Monday 4 May, morning", address: "4 Elm Row", forOperative: false },
  appointmentConfirmed: { workWords: "Fan repair", slotWords: "Monday 4 May, morning", address: "4 Elm Row" },
  appointmentCancelled: { workWords: "Fan repair", slotWords: "Monday 4 May, morning", address: "4 Elm Row", reason: "" },
  monitoringStarted: { days: 42, endsOn: "15 June" },
  fixConfirmed: {},
  monitoringEnded: { forLead: false, readingsAfter: 0 },
};
const COMMON = { name: "Alex", reference: "DW-2026-00042", link: "https://dewline.example/cases/42", ics: "" };

function renderedMails(): Message[] {
  // Loosely typed on purpose: a template that changes its inputs is reported, not a build failure here.
  const templates = mailTemplates as unknown as Record<
    string,
    ((d: Record<string, unknown>) => { subject: string; text: string }) | undefined
  >;
  return Object.entries(TENANT_MAILS).flatMap(([name, sample]) => {
    const render = templates[name];
    if (!render) return [];
    try {
      const mail = render({ ...COMMON, ...sample });
      return [
        { key: `${name}.subject`, text: mail.subject },
        { key: `${name}.text`, text: mail.text },
      ];
    } catch (error) {
      console.warn(`Could not render the ${name} e-mail: ${(error as Error).message}`);
      return [];
    }
  });
}

function renderedTexts(): Message[] {
  const sample = {
    landlord: "Brookfield Homes",
    reference: "DW-2026-00042",
    workWords: "Fan repair",
    slotWords: "Monday 4 May, 8am to 12 noon",
    link: "https://dewline.example/cases/42",
    rescheduled: false,
  };
  const texts = smsTexts as unknown as Record<string, (d: typeof sample) => string>;
  return Object.entries(texts).map(([kind, render]) => ({ key: kind, text: render(sample) }));
}

function reports(): SourceReport[] {
  const out: SourceReport[] = [];
  const clientDir = path.join(projectRoot, "src/locales/en-GB");
  for (const file of readdirSync(clientDir)
    .filter((f) => f.endsWith(".json"))
    .sort())
    out.push(measureSource(`src/locales/en-GB/${file}`, jsonMessages(path.join(clientDir, file))));

  const serverLocales = path.join(projectRoot, "server/locales");
  const englishDirs = existsSync(serverLocales) ? readdirSync(serverLocales).filter((d) => /^en(-|$)/.test(d)) : [];
  if (englishDirs.length) {
    for (const dir of englishDirs)
      for (const file of readdirSync(path.join(serverLocales, dir))
        .filter((f) => f.endsWith(".json"))
        .sort())
        out.push(measureSource(`server/locales/${dir}/${file}`, jsonMessages(path.join(serverLocales, dir, file))));
  } else {
    out.push(measureSource("tenant e-mails (mail-templates.ts)", renderedMails()));
    out.push(measureSource("text messages (sms-texts.ts)", renderedTexts()));
  }
  return out;
}

const fixed = (n: number) => (Number.isFinite(n) ? n.toFixed(1) : "–");

function print(all: SourceReport[]): void {
  console.log("Flesch-Kincaid grade (Kincaid et al. 1975, US Navy Research Branch Report 8-75); reading age = grade + 5.\n");
  const rows = all.map((r) => [r.source, String(r.messages), String(r.words), fixed(r.grade), fixed(r.readingAge)]);
  const head = ["source", "messages", "words", "FK grade", "reading age"];
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join("  ");
  console.log(line(head));
  console.log(widths.map((w) => "-".repeat(w)).join("  "));
  for (const r of rows) console.log(line(r));
  for (const r of all) {
    if (!r.hardest.length) continue;
    console.log(`\nHardest in ${r.source}:`);
    for (const h of r.hardest)
      console.log(`  ${fixed(h.grade).padStart(5)}  (age ${fixed(h.readingAge)}, ${h.words} words)  ${h.key}`);
  }
}

print(reports());
