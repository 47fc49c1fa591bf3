// The whole API's OpenAPI document and the staff reference page: built from the contract and the
// routes' schemas, covering every mounted route, staff only, and served entirely from our origin.
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ENDPOINTS } from "../../src/lib/contracts/index.js";
import { REQUESTS } from "../../server/modules/api-docs/api-registry.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { anonymousClient, createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle: { stack?: Layer[] };
  /** router 2: what of the path the layer matched, or false. */
  match(path: string): { path: string } | false;
}

let t: TestApp;
let officer: Client;
let tenant: Client;

beforeAll(async () => {
  t = await createTestApp();
  const landlord = await makeLandlord(t.ctx.dataSource);
  officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(() => t.close());

/** Every route of the Express app, as the chain of routers a request passes to reach it. */
function routeChains(): Layer[][] {
  const chains: Layer[][] = [];
  const walk = (stack: Layer[], chain: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) chains.push([...chain, layer]);
      else if (layer.handle.stack) walk(layer.handle.stack, [...chain, layer]);
    }
  };
  walk((t.app as unknown as { router: { stack: Layer[] } }).router.stack, []);
  return chains.filter((c) => c.some((l) => !l.route)); // routes on the app itself are the client's pages
}

/** Would this request reach the route at the end of the chain? */
function reaches(chain: Layer[], method: string, url: string): boolean {
  let rest = url;
  for (const layer of chain) {
    const matched = layer.match(rest);
    if (!matched) return false;
    if (layer.route) return Boolean(layer.route.methods[method.toLowerCase()]);
    rest = rest.slice(matched.path.length) || "/";
  }
  return false;
}
const concrete = (path: string) => path.replace(/:[A-Za-z]+/g, "1");
const label = (chain: Layer[]) =>
  `${Object.keys(chain.at(-1)!.route!.methods).join(",").toUpperCase()} …${chain.at(-1)!.route!.path}`;

describe("the API's OpenAPI document", () => {
  it("lists every route the app mounts, and no route it does not", () => {
    const chains = routeChains();
    expect(chains.length).toBeGreaterThan(50);
    const unlisted = chains.filter((c) => !ENDPOINTS.some((e) => reaches(c, e.method, concrete(e.path))));
    expect(unlisted.map(label)).toEqual([]);
    const stale = ENDPOINTS.filter((e) => !chains.some((c) => reaches(c, e.method, concrete(e.path))));
    expect(stale.map((e) => `${e.method} ${e.path}`)).toEqual([]);
    for (const key of Object.keys(REQUESTS)) expect(ENDPOINTS.map((e) => `${e.method} ${e.path}`)).toContain(key);
  });

  it("gives staff the whole API, with request and response schemas from the zod schemas", async () => {
    const doc = (await officer.get("/api/openapi.json").expect(200)).body;
    expect(doc.openapi).toBe("3.1.0");
    for (const e of ENDPOINTS)
      expect(doc.paths[e.path.replace(/:([A-Za-z]+)/g, "{$1}")], `${e.method} ${e.path}`).toHaveProperty(e.method.toLowerCase());
    const getCase = doc.paths["/api/cases/{id}"].get;
    expect(getCase.responses["200"].content["application/json"].schema.properties.status.enum).toContain("works-planned");
    const inspection = doc.paths["/api/cases/{id}/inspections"].post.requestBody.content["application/json"].schema;
    expect(inspection.required).toEqual(expect.arrayContaining(["inspectedAt", "cause", "findings"]));
    expect(doc.paths["/api/work-orders"].get.parameters.map((p: { name: string }) => p.name)).toEqual(
      expect.arrayContaining(["status", "page", "pageSize"]),
    );
    expect(doc.paths["/api/policy"].put.description).toBe("Roles: admin.");
  });

  it("is refused to tenants (403) and to anyone not signed in (401), page and document alike", async () => {
    await tenant.get("/api/openapi.json").expect(403);
    await tenant.get("/api/docs").expect(403);
    await tenant.get("/api/docs/swagger-ui-bundle.js").expect(403);
    const anonymous = await anonymousClient(t.app);
    await anonymous.get("/api/openapi.json").expect(401);
    await anonymous.get("/api/docs").expect(401);
    // The public risk-engine API keeps its own public document.
    await request(t.app).get("/api/psychrometrics/openapi.json").expect(200);
  });

  it("serves the reference page to staff with every script and style from our own origin, under the CSP", async () => {
    const res = await officer.get("/api/docs").expect(200).expect("Content-Type", /html/);
    const csp = res.headers["content-security-policy"] as string;
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    const assets = [...res.text.matchAll(/(?:src|href)="([^"]+)"/g)].map((m) => m[1]!);
    expect(assets).toEqual(["/api/docs/swagger-ui.css", "/api/docs/swagger-ui-bundle.js", "/api/docs/start.js"]);
    expect(res.text).not.toMatch(/<script>(?!<\/script>)|<style>/); // no inline script or style
    for (const asset of assets) {
      const got = await officer.get(asset).expect(200);
      expect(got.headers["content-type"]).toMatch(asset.endsWith(".css") ? /text\/css/ : /javascript/);
    }
    expect((await officer.get("/api/docs/start.js")).text).toContain('url: "/api/openapi.json"');
  });
});
