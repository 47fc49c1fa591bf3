// A tenant's language: shown by GET /api/auth/me (and the sign-in reply), chosen with PUT /api/me/language.
// Only tenants choose (staff screens are English); only "en" and "cy" are taken; a tenant changes only their own.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { User } from "../../server/modules/users/user.entity.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let tenant: Client;
let tenantId: number;
let neighbour: Client;
let neighbourId: number;
let officer: Client;
let admin: Client;

const put = (client: Client, body: object) => client.agent.put("/api/me/language").set("X-CSRF-Token", client.csrf).send(body);
const storedLanguageOf = async (id: number) =>
  (await t.ctx.dataSource.getRepository(User).findOneByOrFail({ id })).preferredLanguage;

beforeAll(async () => {
  t = await createTestApp();
  const landlord = await makeLandlord(t.ctx.dataSource);
  tenantId = landlord.tenant.id;
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  const next = await makeTenant(t.ctx.dataSource, landlord.org, await makeProperty(t.ctx.dataSource, landlord.org), {
    preferredLanguage: "en",
  });
  neighbourId = next.id;
  neighbour = await signedInClient(t.app, next.email, PASSWORD);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  admin = await signedInClient(t.app, landlord.admin.email, PASSWORD);
});

afterAll(() => t.close());

describe("a tenant's language", () => {
  it("is not known until someone says, then the tenant chooses Welsh and sees it at once", async () => {
    expect((await tenant.get("/api/auth/me").expect(200)).body.language).toBeNull();

    const saved = await put(tenant, { language: "cy" }).expect(200);
    expect(saved.body).toEqual({ language: "cy" });
    expect((await tenant.get("/api/auth/me").expect(200)).body.language).toBe("cy");
    expect(await storedLanguageOf(tenantId)).toBe("cy");
  });

  it("comes back with the sign-in reply, so the first page is already in it", async () => {
    const { email } = await t.ctx.dataSource.getRepository(User).findOneByOrFail({ id: tenantId });
    const { body } = await (await anonymousClient(t.app)).post("/api/auth/login", { email, password: PASSWORD }).expect(200);
    expect(body.user.language).toBe("cy");
  });

  it("refuses a language Dewline has no text for, and a pseudo-locale, changing nothing", async () => {
    for (const language of ["pl", "en-XA", "", null, 3]) {
      const res = await put(tenant, { language }).expect(400);
      expect(res.body.error.code).toBeTruthy();
    }
    await put(tenant, {}).expect(400);
    expect(await storedLanguageOf(tenantId)).toBe("cy");
  });

  it("is each tenant's own: one tenant's choice leaves a neighbour's alone", async () => {
    await put(tenant, { language: "en" }).expect(200);
    await put(neighbour, { language: "cy" }).expect(200);
    expect(await storedLanguageOf(tenantId)).toBe("en");
    expect(await storedLanguageOf(neighbourId)).toBe("cy");
    expect((await tenant.get("/api/auth/me").expect(200)).body.language).toBe("en");
  });

  it("is not for staff to choose: staff screens are in English", async () => {
    await put(officer, { language: "cy" }).expect(403);
    await put(admin, { language: "cy" }).expect(403);
    expect((await officer.get("/api/auth/me").expect(200)).body).toHaveProperty("language");
  });

  it("cannot be set by someone who is not signed in", async () => {
    await put(await anonymousClient(t.app), { language: "cy" }).expect(401);
  });
});
