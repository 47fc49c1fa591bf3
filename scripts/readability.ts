// Reading age of the text tenants read (`npm run readability`): each namespace of src/locales/en-GB,
// the tenant e-mails and the text messages, by the Flesch-Kincaid grade (scripts/lib/readability.ts
// names the formula and its source). E-mails and texts are read from server/locales/en-GB/{mail,sms}.ts,
// where all their words live (the templates only put them together), placeholders stripped as for the
// client's ICU messages: links, names and words people typed are left out.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import englishMail from "../server/locales/en-GB/mail.js";
import englishSms from "../server/locales/en-GB/sms.js";
import { flattenMessages, icuToText, measureSource, type Message, type SourceReport } from "./lib/readability.js";
import { projectRoot } from "./lib/paths.js";

/** Messages of one JSON file of ICU messages. */
const jsonMessages = (file: string): Message[] => icuMessages(JSON.parse(readFileSync(file, "utf8")));

/** Messages of a server locale module (flat keys to ICU messages). */
const moduleMessages = (messages: Record<string, string>): Message[] => icuMessages(messages);

function icuMessages(tree: Record<string, unknown>): Message[] {
  return flattenMessages(tree).map(([key, message]) => {
    let text: string;
    try {
      text = icuToText(message);
    } catch {
      text = message; // not ICU after all: read as it stands
    }
    return { key, text };
  });
}

function reports(): SourceReport[] {
  const out: SourceReport[] = [];
  const clientDir = path.join(projectRoot, "src/locales/en-GB");
  for (const file of readdirSync(clientDir)
    .filter((f) => f.endsWith(".json"))
    .sort())
    out.push(measureSource(`src/locales/en-GB/${file}`, jsonMessages(path.join(clientDir, file))));

  // The tenant e-mails and texts live in server/locales/en-GB/{mail,sms}.ts (ICU messages, imported as
  // modules); placeholders are stripped as for the client's messages, so only the words are counted.
  out.push(measureSource("server/locales/en-GB/mail.ts (tenant e-mails)", moduleMessages(englishMail)));
  out.push(measureSource("server/locales/en-GB/sms.ts (text messages)", moduleMessages(englishSms)));
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
