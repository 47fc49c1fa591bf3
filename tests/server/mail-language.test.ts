// E-mails and texts to a tenant come in the tenant's language (users.preferred_language): Welsh for
// "cy", English for "en", no language, or one Dewline has no words for ("pl"). Staff copies of the same
// event stay English. The words are checked too: every key in both languages, every message parses.
import { IntlMessageFormat } from "intl-messageformat";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startSmsStandIn, type SmsStandIn } from "../../scripts/lib/sms-stand-in.js";
import { loadConfig } from "../../server/config/env.js";
import { MESSAGE_LANGUAGES, MESSAGES, messageLanguage, translator } from "../../server/lib/i18n.js";
import { mailTemplates } from "../../server/modules/mail/mail-templates.js";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import { OutboxSms } from "../../server/modules/sms/outbox-sms.entity.js";
import { renderSms, SMS_KINDS, type SmsTexts } from "../../server/modules/sms/sms-texts.js";
import { WORK_WORDS } from "../../server/modules/works/work-order.service.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { hoursAgo, workingDayAhead } from "../support/test-clock.js";

let t: TestApp;
let phone: SmsStandIn;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let officer: Client;
let lead: Client;

const report = {
  description: "Black mould round the bathroom window.",
  locations: ["ceiling"],
  observations: ["mould-spots"],
};

/** A tenant of their own home with texts on, in a language; returns their client and mobile number. */
async function tenantIn(language: string | null, number: string): Promise<Client> {
  const home = await makeProperty(t.ctx.dataSource, landlord.org);
  const user = await makeTenant(t.ctx.dataSource, landlord.org, home, { preferredLanguage: language });
  const client = await signedInClient(t.app, user.email, PASSWORD);
  await client.agent
    .put("/api/me/texts")
    .set("X-CSRF-Token", client.csrf)
    .send({ mobileNumber: number, textsOn: true })
    .expect(200);
  return client;
}

/** The tenant reports, an officer triages and inspects, the lead books a morning visit. */
async function reportAndBook(tenant: Client, daysAhead: number): Promise<number> {
  const c = (await tenant.post("/api/cases", report).expect(201)).body;
  await officer.patch(`/api/cases/${c.id}`, { status: "triaged", hazardClass: "significant", reason: "Mould." }).expect(200);
  await officer
    .post(`/api/cases/${c.id}/inspections`, {
      inspectedAt: hoursAgo(1).toISOString(),
      cause: "condensation",
      mouldExtent: "under-1-m2",
      findings: "Condensation mould on a cold outside wall.",
      roomReadings: [],
    })
    .expect(201);
  const wo = (
    await officer.post(`/api/cases/${c.id}/work-orders`, { type: "mould-wash", description: "Wash and treat." }).expect(201)
  ).body;
  await lead
    .patch(`/api/work-orders/${wo.id}`, {
      assigneeId: landlord.maintenance.id,
      slot: { date: workingDayAhead(daysAhead), window: "am" },
    })
    .expect(200);
  await t.ctx.services.sms.relay.idle();
  return c.id as number;
}

const mailsOf = (caseId: number) =>
  t.ctx.dataSource.getRepository(OutboxEmail).find({ where: { relatedType: "case", relatedId: caseId }, order: { id: "ASC" } });
const textsOf = (caseId: number) =>
  t.ctx.dataSource.getRepository(OutboxSms).find({ where: { relatedType: "case", relatedId: caseId }, order: { id: "ASC" } });

beforeAll(async () => {
  const defaults = loadConfig({});
  phone = await startSmsStandIn({ apiKey: defaults.sms.apiKey, templateId: defaults.sms.templateId });
  t = await createTestApp({ SMS_BASE_URL: phone.url });
  landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  lead = await signedInClient(t.app, landlord.maintenance.email, PASSWORD);
});
afterAll(async () => {
  await t?.close();
  await phone?.close();
});

const WELSH_DAY = /Dydd (Llun|Mawrth|Mercher|Iau|Gwener|Sadwrn|Sul), \d{1,2} \p{L}+ \d{4}, yn y bore/u;
const ENGLISH_DAY = /(Monday|Tuesday|Wednesday|Thursday|Friday|Saturday|Sunday), \d{1,2} [A-Z][a-z]+ \d{4}, morning/;

describe("a tenant's e-mails and texts in their language", () => {
  it("a Welsh-speaking tenant gets the acknowledgement, the appointment e-mail and its text in Welsh; the operative's copy stays English", async () => {
    const caseId = await reportAndBook(await tenantIn("cy", "07700 900201"), 10);
    const mails = await mailsOf(caseId);
    const ack = mails.find((m) => m.template === "caseAcknowledgement")!;
    expect(ack.subject).toMatch(/^Rydym wedi cael eich adroddiad DW-/);
    expect(ack.textBody).toMatch(/^Helo /);
    expect(ack.textBody).toContain("Diolch am ddweud wrthym am leithder neu lwydni");
    // The safety lines, in Welsh with the same meaning: the landlord's emergency line and the gas line.
    expect(ack.textBody).toMatch(/Os oes dŵr yn dod drwy nenfwd ger goleuadau neu socedi, ffoniwch linell argyfwng/);
    expect(ack.textBody).toContain("ffoniwch y llinell argyfwng nwy ar 0800 111 999");
    expect(ack.textBody).not.toMatch(/Hello|Thank you|emergency line/);
    expect(ack.htmlBody).toContain("Diolch am ddweud wrthym");

    const [toTenant, toOperative] = mails.filter((m) => m.template === "appointmentProposed");
    expect(toTenant!.subject).toMatch(/^Apwyntiad arfaethedig: golchi llwydni a thriniaeth ffwngladdol, /);
    expect(toTenant!.subject).toMatch(WELSH_DAY);
    expect(toTenant!.textBody).toContain("Cadarnhewch ar dudalen eich achos");
    expect(toOperative!.toAddress).toBe(landlord.maintenance.email);
    expect(toOperative!.subject).toMatch(/^Booked: mould wash and fungicidal treatment, /);
    expect(toOperative!.subject).toMatch(ENGLISH_DAY);

    const [text] = await textsOf(caseId);
    expect(text).toMatchObject({ kind: "appointment-offered", status: "sent" });
    expect(text!.body).toMatch(/: Gallwn ddod ynghylch eich adroddiad lleithder a llwydni DW-/);
    expect(text!.body).toMatch(WELSH_DAY);
    // What the phone got is what the outbox kept.
    expect(phone.messages().find((m) => m.id === text!.providerId)!.body).toBe(text!.body);
  });

  it("an English-speaking tenant, and one whose language Dewline has no words for, get the same event in English", async () => {
    // A day each: one operative cannot be booked twice in one morning.
    for (const [language, number, daysAhead] of [
      ["en", "07700 900202", 11],
      ["pl", "07700 900203", 12],
      [null, "07700 900204", 13],
    ] as const) {
      const caseId = await reportAndBook(await tenantIn(language, number), daysAhead);
      const mails = await mailsOf(caseId);
      const ack = mails.find((m) => m.template === "caseAcknowledgement")!;
      expect(ack.subject, String(language)).toMatch(/^We have your report DW-/);
      expect(ack.textBody).toMatch(/^Hello /);
      expect(ack.textBody).toContain("call the gas emergency line on 0800 111 999");
      const toTenant = mails.find((m) => m.template === "appointmentProposed")!;
      expect(toTenant.subject).toMatch(/^Proposed appointment: mould wash and fungicidal treatment, /);
      expect(toTenant.subject).toMatch(ENGLISH_DAY);
      const [text] = await textsOf(caseId);
      expect(text!.body).toMatch(/: We can come for your damp and mould report DW-/);
    }
  });
});

describe("the words", () => {
  it("every key exists in every language, and every message parses as ICU in its language", () => {
    for (const ns of ["mail", "sms"] as const) {
      const keys = Object.keys(MESSAGES["en-GB"][ns]).sort();
      for (const lng of MESSAGE_LANGUAGES) {
        const messages: Record<string, string> = MESSAGES[lng][ns];
        expect(Object.keys(messages).sort(), `${lng}/${ns}`).toEqual(keys);
        for (const [key, text] of Object.entries(messages)) {
          expect(() => new IntlMessageFormat(text, lng).getAst(), `${lng}/${ns}:${key}`).not.toThrow();
          expect(text.trim(), `${lng}/${ns}:${key}`).not.toBe("");
        }
      }
    }
  });

  it("the English work words are the staff screens' words, and stored tags map to a language with English as fallback", () => {
    for (const [type, words] of Object.entries(WORK_WORDS))
      expect(MESSAGES["en-GB"].mail[`work.${type}` as "work.other"]).toBe(words);
    expect(["cy", "CY", "cy-GB", "en", "en-GB", "pl", "", null, undefined].map(messageLanguage)).toEqual([
      "cy",
      "cy",
      "cy",
      "en-GB",
      "en-GB",
      "en-GB",
      "en-GB",
      "en-GB",
      "en-GB",
    ]);
  });

  it("a sensor's findings and the mould cautions are worded in the tenant's language; room names stay as the landlord keeps them", () => {
    const d = {
      name: "Ana",
      reference: "DW-2026-00009",
      address: "4 Heol y Nant",
      link: "http://dewline.test/cases/9",
      organisationName: "Cwm Homes",
      emergencyPhone: null,
      findings: [
        { room: "Bedroom", rule: "condensing-days", hoursAt80: 0, condensingDays: 3 },
        { room: null, rule: "hours-at-80", hoursAt80: 40.4, condensingDays: 0 },
      ],
    };
    const cy = mailTemplates.sensorCaseNotice(d, translator("cy", "mail")).text;
    expect(cy).toContain("- Bedroom: roedd dŵr yn cyddwyso ar arwyneb oer ar 3 o'r 7 diwrnod diwethaf.");
    expect(cy).toContain(
      "- Ystafell: dros y 7 diwrnod diwethaf, roedd wyneb wal neu ffenestr yn ddigon llaith i lwydni ddechrau am tua 40 awr.",
    );
    expect(cy).toContain("peidiwch â'i grafu'n sych na'i frwsio");
    expect(cy).toContain("(mae'r rhif ar eich contract meddiannaeth)");
    const en = mailTemplates.sensorCaseNotice(d, translator("en-GB", "mail")).text;
    expect(en).toContain("- Bedroom: water was condensing on a cold surface on 3 of the last 7 days.");
    expect(en).toContain(
      "- A room: over the last 7 days, a wall or window surface was damp enough for mould to start for about 40 hours.",
    );
  });

  it("Welsh texts keep to the GSM-7 alphabet (charged per 160 characters) and to at most two parts, like the English", () => {
    // GSM 03.38's basic set (from memory): â, ŵ, ŷ are not in it, so one of them makes the whole text UCS-2 (70 a part).
    const GSM7 = /^[@£$¥èéùìòÇ\nØø\rÅåΔ_ΦΓΛΩΠΨΣΘΞÆæßÉ !"#¤%&'()*+,\-./0-9:;<=>?¡A-ZÄÖÑÜ§¿a-zäöñüà]*$/u;
    const parts = (body: string) => {
      const gsm = GSM7.test(body);
      const single = gsm ? 160 : 70;
      const multi = gsm ? 153 : 67;
      return { gsm, length: body.length, parts: body.length <= single ? 1 : Math.ceil(body.length / multi) };
    };
    const common = { landlord: "Cwm Taf Homes", reference: "DW-2026-01234", link: "https://dewline.example/cases/123456" };
    const data: { [K in (typeof SMS_KINDS)[number]]: SmsTexts[K] } = {
      "appointment-offered": {
        ...common,
        workType: "fan-upgrade",
        slot: { date: "2026-09-30", window: "all-day" },
        rescheduled: true,
      },
      "appointment-reminder": { ...common, workType: "fan-upgrade", slot: { date: "2026-09-30", window: "all-day" } },
      "landlord-replied": common,
      "summary-sent": common,
    };
    const measured = SMS_KINDS.map((kind) => ({
      kind,
      en: parts(renderSms(kind, data[kind] as never, "en-GB")),
      cy: parts(renderSms(kind, data[kind] as never, "cy")),
    }));
    console.log(JSON.stringify(measured));
    for (const m of measured) {
      expect(m.cy.gsm, m.kind).toBe(true);
      expect(m.cy.parts, m.kind).toBeLessThanOrEqual(2);
      expect(m.en.parts, m.kind).toBeLessThanOrEqual(2);
    }
  });
});
