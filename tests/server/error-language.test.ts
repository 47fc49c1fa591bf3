// The server's messages a tenant can meet come in the tenant's language: a Welsh tenant reads Welsh, from
// the language stored on their account; signed out, the language the page asks for (Accept-Language).
// An English tenant and staff (whatever their browser says) read exactly today's English.
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { ZodType } from "zod";
import { ERROR_MESSAGE_IDS } from "../../server/lib/error-language.js";
import { MESSAGE_LANGUAGES, translator } from "../../server/lib/i18n.js";
import { escalateComplaintSchema, raiseComplaintSchema } from "../../server/modules/complaints/complaints.schemas.js";
import enErrors from "../../server/locales/en-GB/errors.js";
import { caseReportSchema } from "../../src/lib/schemas/case-report.js";
import { MESSAGE_MAX_LENGTH, tenantMessageSchema } from "../../src/lib/schemas/messages.js";
import { makeLandlord, makeUser, PASSWORD } from "../support/factories.js";
import { hoursAgo } from "../support/test-clock.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

const uploads = mkdtempSync(path.join(tmpdir(), "dewline-test-error-language-"));
let t: TestApp;
let welsh: Client;
let english: Client;
let officer: Client;
let otherCaseId: number;

const report = { description: "Mould on the bedroom ceiling.", locations: ["ceiling"], observations: ["mould-spots"] };

beforeAll(async () => {
  t = await createTestApp({ UPLOADS_DIR: uploads });
  const ds = t.ctx.dataSource;
  const landlord = await makeLandlord(ds);
  await ds.getRepository("User").update({ id: landlord.tenant.id }, { preferredLanguage: "cy" });
  welsh = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  // Another landlord's tenant, who reads English, and their report.
  const other = await makeLandlord(ds);
  await ds.getRepository("User").update({ id: other.tenant.id }, { preferredLanguage: "en" });
  english = await signedInClient(t.app, other.tenant.email, PASSWORD);
  otherCaseId = (await english.post("/api/cases", report).expect(201)).body.id as number;
});

afterAll(async () => {
  await t.close();
  rmSync(uploads, { recursive: true, force: true });
});

describe("a Welsh tenant reads the server's messages in Welsh", () => {
  it("another home's report: not found, in Welsh (the code stays the same)", async () => {
    const res = await welsh.get(`/api/cases/${otherCaseId}`).expect(404);
    expect(res.body.error).toEqual({ code: "not_found", message: "Nid yw’r adroddiad hwn yn bodoli." });
  });

  it("a report without a description: the field's message and the summary in Welsh", async () => {
    const res = await welsh.post("/api/cases", { ...report, description: "" }).expect(400);
    expect(res.body.error.code).toBe("validation_failed");
    expect(res.body.error.message).toBe("description: Dywedwch wrthym mewn ychydig eiriau beth rydych chi’n ei weld.");
    expect(res.body.error.details).toEqual([
      { field: "description", message: "Dywedwch wrthym mewn ychydig eiriau beth rydych chi’n ei weld." },
    ]);
  });

  it("a text file sent as a photo: refused in Welsh", async () => {
    const caseId = (await welsh.post("/api/cases", report).expect(201)).body.id as number;
    const res = await welsh.agent
      .post(`/api/cases/${caseId}/photos`)
      .set("X-CSRF-Token", welsh.csrf)
      .attach("photos", Buffer.from("just some words, not an image"), "damp.jpg")
      .expect(415);
    expect(res.body.error.message).toBe(
      "Nid yw’r ffeil hon yn llun y gallwn ei ddarllen. Anfonwch luniau JPEG, PNG, WebP neu AVIF.",
    );
  });

  it("a request without its security token: refused in Welsh", async () => {
    const res = await welsh.agent.post("/api/cases").send(report).expect(403);
    expect(res.body.error.code).toBe("csrf_invalid");
    expect(res.body.error.message).toMatch(/^Mae’r dudalen hon wedi bod ar agor yn rhy hir/);
  });

  it("an answer to an appointment that was never offered: a conflict, in Welsh", async () => {
    const caseId = (await welsh.post("/api/cases", report).expect(201)).body.id as number;
    await officer
      .patch(`/api/cases/${caseId}`, { status: "triaged", hazardClass: "significant", reason: "Mould in a bedroom." })
      .expect(200);
    await officer
      .post(`/api/cases/${caseId}/inspections`, {
        inspectedAt: hoursAgo(1).toISOString(),
        cause: "condensation",
        mouldExtent: "under-1-m2",
        findings: "Condensation mould on the ceiling.",
        roomReadings: [],
      })
      .expect(201);
    const wo = (
      await officer
        .post(`/api/cases/${caseId}/work-orders`, { type: "extractor-fan", description: "Fit an extract fan." })
        .expect(201)
    ).body;
    const res = await welsh.post(`/api/work-orders/${wo.id}/booking-response`, { response: "confirm" }).expect(409);
    expect(res.body.error).toEqual({
      code: "conflict",
      message: "Nid oes apwyntiad yn aros am eich ateb ar gyfer y gwaith hwn.",
    });
  });
});

describe("signed out, the language the page asks for", () => {
  it("a failed sign-in with Welsh asked for is Welsh; without, today's English", async () => {
    const anon = await anonymousClient(t.app);
    const cy = await anon
      .post("/api/auth/login", { email: "nobody@example.org", password: "wrong password" })
      .set("Accept-Language", "cy")
      .expect(401);
    expect(cy.body.error.message).toBe("Nid yw’r cyfeiriad e-bost a’r cyfrinair yn cyfateb i gyfrif gweithredol.");
    const en = await anon.post("/api/auth/login", { email: "nobody@example.org", password: "wrong password" }).expect(401);
    expect(en.body.error.message).toBe("That e-mail address and password do not match an active account.");
  });

  it("the wait after several failed sign-ins is Welsh, with its number of seconds", async () => {
    const ds = t.ctx.dataSource;
    const landlord = await makeLandlord(ds);
    const person = await makeUser(ds, landlord.org, "tenant");
    const anon = await anonymousClient(t.app);
    for (let i = 0; i < 5; i++) {
      await anon.post("/api/auth/login", { email: person.email, password: "guess" }).set("Accept-Language", "cy").expect(401);
    }
    const held = await anon
      .post("/api/auth/login", { email: person.email, password: "guess" })
      .set("Accept-Language", "cy, en-GB;q=0.8")
      .expect(429);
    const wait = Number(held.headers["retry-after"]);
    expect(held.body.error.message).toContain(`Arhoswch ${wait} eiliad a rhowch gynnig arall arni.`);
  });
});

describe("an English tenant and staff read today's English", () => {
  it("an English tenant: English even when the browser asks for Welsh", async () => {
    const res = await english
      .get(`/api/cases/${otherCaseId + 1_000_000}`)
      .set("Accept-Language", "cy")
      .expect(404);
    expect(res.body.error.message).toBe("No such case.");
    const invalid = await english
      .post("/api/cases", { ...report, description: "" })
      .set("Accept-Language", "cy")
      .expect(400);
    expect(invalid.body.error.message).toBe("description: Tell us in a few words what you see.");
  });

  it("staff: English, whatever the browser asks for", async () => {
    const res = await officer.get(`/api/cases/${otherCaseId}`).set("Accept-Language", "cy").expect(404);
    expect(res.body.error).toEqual({ code: "not_found", message: "No such case." });
    const csrf = await officer.agent.post("/api/cases").set("Accept-Language", "cy").send(report).expect(403);
    expect(csrf.body.error.message).toBe(
      "The security token of this request is missing or out of date. Reload the page and try again.",
    );
  });
});

describe("the error catalogue", () => {
  const values = { minutes: 3, seconds: 40, most: 120 };

  it("has every message in every language, and each one renders", () => {
    for (const language of MESSAGE_LANGUAGES) {
      const t = translator(language, "errors");
      for (const id of ERROR_MESSAGE_IDS) {
        const text = t(id, values);
        expect(text, `${language} ${id}`).not.toBe(id);
        expect(text.trim().length, `${language} ${id}`).toBeGreaterThan(0);
      }
    }
  });

  const serverSource = (dir: string): string[] =>
    readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
      e.isDirectory()
        ? serverSource(path.join(dir, e.name))
        : e.name.endsWith(".ts") && !dir.includes("locales")
          ? [readFileSync(path.join(dir, e.name), "utf8")]
          : [],
    );
  const code = [...serverSource("server"), ...serverSource("src/lib/schemas")].join("\n");

  it("names only ids it has wherever a message is thrown with values", () => {
    const used = [...code.matchAll(/\bid: "([a-z0-9-]+)"/g)].map((m) => m[1]!);
    const sayings = [...code.matchAll(/\.saying\(([\s\S]*?)\)[;,]?\n/g)].flatMap((m) =>
      [...m[1]!.matchAll(/id: "([a-z0-9-]+)"/g)].map((x) => x[1]!),
    );
    expect(sayings.length).toBeGreaterThan(0);
    for (const id of sayings) expect(ERROR_MESSAGE_IDS, id).toContain(id);
    expect(used.length).toBeGreaterThan(0);
  });

  // Messages the schemas build from a template ("Choose at least one ${what}."): checked by running them.
  const issues = (schema: ZodType, value: unknown) => schema.safeParse(value).error?.issues.map((i) => i.message) ?? [];
  const templated = new Set([
    ...issues(caseReportSchema, { description: "x".repeat(5000), locations: [], observations: [] }),
    ...issues(tenantMessageSchema, { body: "" }),
    ...issues(tenantMessageSchema, { body: "x".repeat(MESSAGE_MAX_LENGTH + 1) }),
    ...issues(raiseComplaintSchema, { description: "" }),
    ...issues(raiseComplaintSchema, { description: "x".repeat(5001) }),
    ...issues(escalateComplaintSchema, { version: 1, reason: "" }),
    ...issues(escalateComplaintSchema, { version: 1, reason: "x".repeat(5001) }),
  ]);

  it("keeps English texts the server still sends (a changed English text would silently lose its Welsh)", () => {
    for (const id of ERROR_MESSAGE_IDS) {
      const english = enErrors[id];
      if (templated.has(english)) continue;
      // The words before the first value, or a field message's words after the field's name.
      const fixed = english.split("{")[0]!.replace(/^[A-Za-z]+: /, "");
      const found = code.includes(fixed) || code.includes(fixed.charAt(0).toLowerCase() + fixed.slice(1));
      expect(found, `${id}: ${fixed}`).toBe(true);
    }
  });
});
