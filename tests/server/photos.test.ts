// The photo pipeline through the API: decoding, metadata stripped, re-encoded copies, dedupe and access.
import { existsSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import path from "node:path";
import sharp from "sharp";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Photo } from "../../server/modules/photos/photo.entity.js";
import { heicHeader, jpegWithGps, png, sidewaysJpeg } from "../support/images.js";
import { makeLandlord, makeProperty, makeTenant, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";
import { tmpdir } from "node:os";

const uploads = mkdtempSync(path.join(tmpdir(), "dewline-test-uploads-"));
let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let caseId: number;

beforeAll(async () => {
  t = await createTestApp({ UPLOADS_DIR: uploads });
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  caseId = (
    await tenant
      .post("/api/cases", {
        description: "Black spots behind the wardrobe.",
        locations: ["behind-furniture"],
        observations: ["mould-spots"],
      })
      .expect(201)
  ).body.id;
});
afterAll(async () => {
  await t.close();
  rmSync(uploads, { recursive: true, force: true });
});

const upload = (client: Client, id: number, files: [Buffer, string][]) => {
  const req = client.agent.post(`/api/cases/${id}/photos`).set("X-CSRF-Token", client.csrf);
  for (const [buf, name] of files) req.attach("photos", buf, name);
  return req;
};

describe("uploading photos", () => {
  it("strips all EXIF including GPS, re-encodes a display copy and a thumbnail, and serves them only through the API", async () => {
    const original = await jpegWithGps(3000, 2000);
    expect((await sharp(original).metadata()).exif).toBeDefined();
    const res = await upload(tenant, caseId, [[original, "IMG_0001.jpg"]]).expect(201);
    const [photo] = res.body.photos;
    expect(photo).toMatchObject({
      width: 2048,
      height: 1365,
      url: `/api/photos/${photo.id}`,
      thumbnailUrl: `/api/photos/${photo.id}/thumbnail`,
    });
    expect(photo.sha256).toMatch(/^[0-9a-f]{64}$/);

    const display = await tenant.agent
      .get(photo.url)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on("data", (c: Buffer) => chunks.push(c));
        r.on("end", () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    const meta = await sharp(display.body as Buffer).metadata();
    expect(meta.format).toBe("jpeg");
    expect(meta.exif).toBeUndefined();
    expect(meta.xmp).toBeUndefined();
    expect((display.body as Buffer).includes(Buffer.from("Dewline Test Phone"))).toBe(false);
    const thumb = await tenant.agent
      .get(photo.thumbnailUrl)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on("data", (c: Buffer) => chunks.push(c));
        r.on("end", () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    const thumbMeta = await sharp(thumb.body as Buffer).metadata();
    expect(Math.max(thumbMeta.width!, thumbMeta.height!)).toBe(320);
    expect(thumbMeta.exif).toBeUndefined();

    // Stored under the organisation and case, with random names; the upload's name is not used.
    const dir = path.join(uploads, String(landlord.org.id), String(caseId));
    const files = readdirSync(dir);
    expect(files.some((f) => f.includes("IMG_0001"))).toBe(false);
    expect(files.every((f) => /^[0-9a-f]{32}(\.thumb)?\.jpg$/.test(f))).toBe(true);
    // Not a public static file.
    await request(t.app)
      .get(`/uploads/${landlord.org.id}/${caseId}/${files[0]}`)
      .expect((r) => expect(r.headers["content-type"]).not.toMatch(/image/));
    await request(t.app).get(photo.url).expect(401);
  });

  it("auto-rotates a sideways phone photo", async () => {
    const res = await upload(tenant, caseId, [[await sidewaysJpeg(), "side.jpg"]]).expect(201);
    expect(res.body.photos[0]).toMatchObject({ width: 200, height: 400 });
  });

  it("stores the same photo twice in one case only once", async () => {
    const image = await png(500, 400);
    const first = await upload(tenant, caseId, [[image, "a.png"]]).expect(201);
    const second = await upload(tenant, caseId, [
      [image, "b.png"],
      [image, "c.png"],
    ]).expect(201);
    expect(second.body.photos.map((p: { id: number }) => p.id)).toEqual([first.body.photos[0].id]);
    expect(await t.ctx.dataSource.getRepository(Photo).countBy({ caseId, sha256: first.body.photos[0].sha256 })).toBe(1);
  });

  it("refuses a text file named .jpg with 415, storing nothing, and takes the good photos sent with one", async () => {
    const before = await t.ctx.dataSource.getRepository(Photo).countBy({ caseId });
    const alone = await upload(tenant, caseId, [[Buffer.from("just some text, not an image"), "evil.jpg"]]).expect(415);
    expect(alone.body.error.message).toMatch(/JPEG, PNG, WebP or AVIF/);
    expect(await t.ctx.dataSource.getRepository(Photo).countBy({ caseId })).toBe(before);
    // Each file on its own: the good one is kept, the bad one refused with its reason.
    const mixed = await upload(tenant, caseId, [
      [await jpegWithGps(200, 200, 7), "good.jpg"],
      [Buffer.from("just some text, not an image"), "evil.jpg"],
    ]).expect(201);
    expect(mixed.body.photos).toHaveLength(1);
    expect(mixed.body.refused).toEqual([{ name: "evil.jpg", reason: expect.stringMatching(/JPEG, PNG, WebP or AVIF/) }]);
    expect(await t.ctx.dataSource.getRepository(Photo).countBy({ caseId })).toBe(before + 1);
  });

  it("gives HEIC its own message telling how to send JPEG", async () => {
    const res = await upload(tenant, caseId, [[heicHeader, "IMG_1234.HEIC"]]).expect(415);
    expect(res.body.error.message).toMatch(/HEIC/);
    expect(res.body.error.message).toMatch(/JPEG/);
  });

  it("refuses other image formats (GIF) with 415", async () => {
    const gif = await sharp({ create: { width: 20, height: 20, channels: 3, background: "#fff" } })
      .gif()
      .toBuffer();
    await upload(tenant, caseId, [[gif, "a.gif"]]).expect(415);
  });

  it("refuses more than 10 files with 400 and a file over 15 MB with 413", async () => {
    const small = await png(10, 10);
    const eleven = Array.from({ length: 11 }, (_, i) => [small, `p${i}.png`] as [Buffer, string]);
    const many = await upload(tenant, caseId, eleven).expect(400);
    expect(many.body.error.message).toMatch(/at most 10/);
    const huge = Buffer.alloc(15 * 1024 * 1024 + 1, 0xff);
    await upload(tenant, caseId, [[huge, "huge.jpg"]]).expect(413);
    await upload(tenant, caseId, []).expect(400);
  });

  it("uses no part of a filename with path characters as a path", async () => {
    const res = await upload(tenant, caseId, [[await jpegWithGps(300, 300, 3), "../../../../etc/passwd.jpg"]]).expect(201);
    expect(res.body.photos).toHaveLength(1);
    expect(existsSync("/etc/passwd.jpg")).toBe(false);
  });

  it("keeps photos to the tenant and their landlord's staff", async () => {
    const photos = (await tenant.get(`/api/cases/${caseId}/photos`).expect(200)).body.photos;
    const id = photos[0].id;
    const officer = await signedInClient(t.app, landlord.officer.email, PASSWORD);
    await officer.agent.get(`/api/photos/${id}/thumbnail`).expect(200);
    const neighbour = await makeTenant(t.ctx.dataSource, landlord.org, await makeProperty(t.ctx.dataSource, landlord.org));
    const neighbourClient = await signedInClient(t.app, neighbour.email, PASSWORD);
    await neighbourClient.agent.get(`/api/photos/${id}`).expect(404);
    await upload(neighbourClient, caseId, [[await png(20, 20), "x.png"]]).expect(404);
    const other = await makeLandlord(t.ctx.dataSource);
    const outsider = await signedInClient(t.app, other.admin.email, PASSWORD);
    await outsider.agent.get(`/api/photos/${id}`).expect(404);
  });
});
