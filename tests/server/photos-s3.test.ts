// Photos with STORAGE_DRIVER=s3: the app against the local S3 stand-in (s3rver as its own process,
// scripts/lib/s3-stand-in.ts), from upload to viewing, and nothing of the photo on the local disk.
import { mkdtempSync, readdirSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { freePort } from "../../scripts/lib/mariadb.js";
import { startS3StandIn, type S3StandIn } from "../../scripts/lib/s3-stand-in.js";
import { Photo } from "../../server/modules/photos/photo.entity.js";
import { jpegWithGps } from "../support/images.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

const work = mkdtempSync(path.join(tmpdir(), "dewline-test-photos-s3-"));
const uploads = path.join(work, "uploads");
let s3: S3StandIn;
let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
let caseId: number;

beforeAll(async () => {
  s3 = await startS3StandIn({ dir: path.join(work, "s3"), port: await freePort(), bucket: "dewline-photos" });
  t = await createTestApp({ UPLOADS_DIR: uploads, ...s3.env });
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
  caseId = (
    await tenant
      .post("/api/cases", {
        description: "Mould on the bathroom ceiling above the shower.",
        locations: ["ceiling"],
        observations: ["mould-spots"],
      })
      .expect(201)
  ).body.id;
});
afterAll(async () => {
  await t?.close();
  await s3?.stop();
  rmSync(work, { recursive: true, force: true });
});

/** GET as raw bytes (supertest would otherwise leave an image body empty). */
const bytesOf = (client: Client, url: string) =>
  client.agent
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    });

function filesUnder(dir: string): string[] {
  try {
    return readdirSync(dir, { recursive: true, encoding: "utf8" }).filter((f) => statSync(path.join(dir, f)).isFile());
  } catch {
    return [];
  }
}

describe("photos in an S3 bucket", () => {
  it("stores an upload in the bucket and shows it back, display copy and thumbnail, only to those allowed", async () => {
    expect(t.ctx.store.driver).toBe("s3");
    const res = await tenant.agent
      .post(`/api/cases/${caseId}/photos`)
      .set("X-CSRF-Token", tenant.csrf)
      .attach("photos", await jpegWithGps(1600, 1200, 5), "IMG_2041.jpg")
      .expect(201);
    const [photo] = res.body.photos;

    const display = await bytesOf(tenant, photo.url).expect(200);
    expect(display.headers["content-type"]).toBe("image/jpeg");
    const meta = await sharp(display.body as Buffer).metadata();
    expect([meta.format, meta.width, meta.height, meta.exif]).toEqual(["jpeg", 1600, 1200, undefined]);
    expect(display.body.length).toBe(Number(display.headers["content-length"]));

    const thumb = await bytesOf(tenant, photo.thumbnailUrl).expect(200);
    const thumbMeta = await sharp(thumb.body as Buffer).metadata();
    expect(Math.max(thumbMeta.width!, thumbMeta.height!)).toBe(320);

    // The objects are in the bucket under the organisation and case; the upload's own name is not used.
    const row = await t.ctx.dataSource.getRepository(Photo).findOneByOrFail({ id: photo.id });
    expect(row.displayPath).toMatch(new RegExp(`^${landlord.org.id}/${caseId}/[0-9a-f]{32}\\.jpg$`));
    const keys = (await t.ctx.store.list(`${landlord.org.id}/${caseId}/`)).map((o) => o.key);
    expect(keys).toEqual(expect.arrayContaining([row.displayPath, row.thumbnailPath]));
    // Nothing of the photo stays on the local disk: only the (now empty) incoming folder.
    expect(filesUnder(uploads)).toEqual([]);

    // Another landlord's staff do not see it.
    const other = await makeLandlord(t.ctx.dataSource);
    const stranger = await signedInClient(t.app, other.officer.email, PASSWORD);
    await stranger.get(photo.url).expect(404);
  });

  it("answers 404 in JSON when the photo's object has gone from the bucket", async () => {
    const res = await tenant.agent
      .post(`/api/cases/${caseId}/photos`)
      .set("X-CSRF-Token", tenant.csrf)
      .attach("photos", await jpegWithGps(400, 300, 6), "gone.jpg")
      .expect(201);
    const row = await t.ctx.dataSource.getRepository(Photo).findOneByOrFail({ id: res.body.photos[0].id });
    await t.ctx.store.delete(row.displayPath);
    const gone = await tenant.get(`/api/photos/${row.id}`).expect(404);
    expect(gone.headers["content-type"]).toMatch(/^application\/json/);
    expect(gone.body.error.message).toMatch(/file is missing/);
  });

  it("answers 503, not 500, while the bucket cannot be reached, and stores nothing", async () => {
    const before = await t.ctx.dataSource.getRepository(Photo).countBy({ caseId });
    const down = await createTestApp({ UPLOADS_DIR: uploads, ...s3.env, S3_ENDPOINT: `http://127.0.0.1:${await freePort()}` });
    try {
      const client = await signedInClient(down.app, landlord.tenant.email, PASSWORD);
      const res = await client.agent
        .post(`/api/cases/${caseId}/photos`)
        .set("X-CSRF-Token", client.csrf)
        .attach("photos", await jpegWithGps(300, 200, 7), "later.jpg")
        .expect(503);
      expect(res.body.error.message).toMatch(/could not be stored/i);
      expect(await t.ctx.dataSource.getRepository(Photo).countBy({ caseId })).toBe(before);
      const shown = await client.get(`/api/cases/${caseId}/photos`).expect(200);
      await client.get(shown.body.photos[0].url).expect(503);
    } finally {
      await down.close();
    }
  });
});
