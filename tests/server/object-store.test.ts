// One suite for both object stores (server/lib/storage.ts): files under a folder, and an S3 bucket
// on s3rver (in-process, any free port, its own temporary folder). What holds for one must hold for
// the other, since the app never knows which one it has.
import { createHash, randomBytes } from "node:crypto";
import { existsSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadConfig } from "../../server/config/env.js";
import {
  DiskObjectStore,
  InvalidObjectKeyError,
  ObjectNotFoundError,
  S3ObjectStore,
  type ObjectStore,
} from "../../server/lib/storage.js";

const work = mkdtempSync(path.join(tmpdir(), "dewline-test-object-store-"));
let s3rver: S3rver;
let endpoint: string;

beforeAll(async () => {
  s3rver = new S3rver({
    address: "127.0.0.1",
    port: 0,
    silent: true,
    directory: path.join(work, "s3rver"),
    configureBuckets: [{ name: "photos" }],
  });
  const { port } = await s3rver.run();
  endpoint = `http://127.0.0.1:${port}`;
});
afterAll(async () => {
  await s3rver?.close();
  rmSync(work, { recursive: true, force: true });
});

const drivers: [string, () => ObjectStore][] = [
  ["disk", () => new DiskObjectStore(path.join(work, "disk"))],
  [
    "s3",
    () =>
      new S3ObjectStore({
        endpoint,
        region: "us-east-1",
        bucket: "photos",
        accessKeyId: "S3RVER",
        secretAccessKey: "S3RVER",
        forcePathStyle: true,
      }),
  ],
];

async function bytesOf(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of body) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

describe.each(drivers)("the %s object store", (driver, make) => {
  let store: ObjectStore;
  // Each driver's keys under their own prefix, so the two never see each other's objects.
  const k = (key: string) => `${driver}-suite/${key}`;

  beforeAll(() => {
    store = make();
  });
  afterAll(async () => {
    await store.close();
  });

  it("gives back the same bytes and content type that were put", async () => {
    const data = randomBytes(70_000);
    await store.put(k("1/a.jpg"), data, { contentType: "image/jpeg" });
    const got = await store.get(k("1/a.jpg"));
    expect(got.contentType).toBe("image/jpeg");
    expect(got.size).toBe(data.length);
    expect((await bytesOf(got.body)).equals(data)).toBe(true);
    expect((await store.read(k("1/a.jpg"))).equals(data)).toBe(true);
  });

  it("keeps a content type that the key's extension would not suggest, and a replacement's new one", async () => {
    await store.put(k("1/report.bin"), Buffer.from("month,cases\n"), { contentType: "text/csv" });
    const first = await store.get(k("1/report.bin"));
    first.body.destroy();
    expect(first.contentType).toBe("text/csv");
    await store.put(k("1/report.bin"), Buffer.from("%PDF-1.7"), { contentType: "application/octet-stream" });
    const got = await store.get(k("1/report.bin"));
    expect(got.contentType).toBe("application/octet-stream");
    expect((await bytesOf(got.body)).toString()).toBe("%PDF-1.7");
  });

  it("answers ObjectNotFoundError for a key that is not there, and exists() false", async () => {
    await expect(store.get(k("nothing/here.jpg"))).rejects.toBeInstanceOf(ObjectNotFoundError);
    await expect(store.read(k("nothing/here.jpg"))).rejects.toBeInstanceOf(ObjectNotFoundError);
    expect(await store.exists(k("nothing/here.jpg"))).toBe(false);
    // A "folder" is not an object either.
    await store.put(k("2/b.jpg"), Buffer.from("x"), { contentType: "image/jpeg" });
    await expect(store.get(k("2"))).rejects.toBeInstanceOf(ObjectNotFoundError);
  });

  it("deletes, and deleting again (or something never stored) is not an error", async () => {
    await store.put(k("3/c.jpg"), Buffer.from("to go"), { contentType: "image/jpeg" });
    expect(await store.exists(k("3/c.jpg"))).toBe(true);
    await store.delete(k("3/c.jpg"));
    expect(await store.exists(k("3/c.jpg"))).toBe(false);
    await store.delete(k("3/c.jpg"));
    await store.delete(k("never/stored.jpg"));
    await expect(store.get(k("3/c.jpg"))).rejects.toBeInstanceOf(ObjectNotFoundError);
  });

  it.each([
    "../escape.jpg",
    "a/../../escape.jpg",
    "/etc/passwd",
    "a\\b.jpg",
    "a//b.jpg",
    "a/./b.jpg",
    ".incoming/x.part",
    "a/.hidden",
    "",
    "a/",
    "with space.jpg",
    "x".repeat(513),
  ])("refuses the key %j for every operation, changing nothing", async (key) => {
    await expect(store.put(key, Buffer.from("x"), { contentType: "text/plain" })).rejects.toBeInstanceOf(InvalidObjectKeyError);
    await expect(store.get(key)).rejects.toBeInstanceOf(InvalidObjectKeyError);
    await expect(store.exists(key)).rejects.toBeInstanceOf(InvalidObjectKeyError);
    await expect(store.delete(key)).rejects.toBeInstanceOf(InvalidObjectKeyError);
  });

  it("lists by prefix, in key order, with sizes", async () => {
    await store.put(k("list/9/z.jpg"), Buffer.alloc(3), { contentType: "image/jpeg" });
    await store.put(k("list/10/y.jpg"), Buffer.alloc(2), { contentType: "image/jpeg" });
    await store.put(k("list/10/x.thumb.jpg"), Buffer.alloc(1), { contentType: "image/jpeg" });
    expect(await store.list(k("list/"))).toEqual([
      { key: k("list/10/x.thumb.jpg"), size: 1 },
      { key: k("list/10/y.jpg"), size: 2 },
      { key: k("list/9/z.jpg"), size: 3 },
    ]);
    // A plain string prefix, as in S3: "list/1" takes in "list/10/…".
    expect((await store.list(k("list/1"))).map((o) => o.key)).toEqual([k("list/10/x.thumb.jpg"), k("list/10/y.jpg")]);
    expect(await store.list(k("list/nothing/"))).toEqual([]);
  });

  it("streams a larger object in and out without changing a byte", async () => {
    const size = 12 * 1024 * 1024 + 17;
    const chunk = randomBytes(1024 * 1024);
    const expected = createHash("sha256");
    async function* body() {
      for (let sent = 0; sent < size;) {
        const part = chunk.subarray(0, Math.min(chunk.length, size - sent));
        expected.update(part);
        sent += part.length;
        yield part;
      }
    }
    await store.put(k("big/object.bin"), Readable.from(body()), { contentType: "application/octet-stream", size });
    const got = await store.get(k("big/object.bin"));
    expect(got.size).toBe(size);
    const actual = createHash("sha256");
    let chunks = 0;
    for await (const c of got.body) {
      actual.update(c as Buffer);
      chunks++;
    }
    expect(actual.digest("hex")).toBe(expected.digest("hex"));
    // It arrived in pieces, not as one buffer.
    expect(chunks).toBeGreaterThan(1);
  });

  it("takes a stream of unknown length", async () => {
    await store.put(k("4/unknown.txt"), Readable.from([Buffer.from("part one, "), Buffer.from("part two")]), {
      contentType: "text/plain",
    });
    expect((await store.read(k("4/unknown.txt"))).toString()).toBe("part one, part two");
  });
});

describe("the disk object store's files", () => {
  it("keeps the photo store's layout (key = path under the folder) and leaves no temporary file", async () => {
    const root = path.join(work, "layout");
    const store = new DiskObjectStore(root);
    await store.put("7/42/0123456789abcdef0123456789abcdef.jpg", Buffer.from("jpeg"), { contentType: "image/jpeg" });
    expect(readdirSync(path.join(root, "7", "42"))).toEqual(["0123456789abcdef0123456789abcdef.jpg"]);
    expect(readdirSync(path.join(root, ".incoming"))).toEqual([]);
  });

  it("leaves nothing behind when a stream fails part way", async () => {
    const root = path.join(work, "failing");
    const store = new DiskObjectStore(root);
    async function* failing() {
      yield Buffer.from("half ");
      throw new Error("the source went away");
    }
    await expect(store.put("1/broken.jpg", Readable.from(failing()), { contentType: "image/jpeg" })).rejects.toThrow(/went away/);
    expect(existsSync(path.join(root, "1", "broken.jpg"))).toBe(false);
    expect(readdirSync(path.join(root, ".incoming"))).toEqual([]);
  });
});

describe("storage configuration", () => {
  const base = { NODE_ENV: "test" };

  it("uses the disk under UPLOADS_DIR unless told otherwise", () => {
    expect(loadConfig({ ...base, UPLOADS_DIR: "/srv/photos" }).storage).toEqual({ driver: "disk", root: "/srv/photos" });
  });

  it("refuses STORAGE_DRIVER=s3 without its bucket and keys, naming each", () => {
    let message = "";
    try {
      loadConfig({ ...base, STORAGE_DRIVER: "s3" });
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toMatch(/S3_BUCKET must be set with STORAGE_DRIVER=s3/);
    expect(message).toMatch(/S3_ACCESS_KEY_ID must be set with STORAGE_DRIVER=s3/);
    expect(message).toMatch(/S3_SECRET_ACCESS_KEY must be set with STORAGE_DRIVER=s3/);
  });

  it("refuses an unknown driver and a path-style flag that is not true or false", () => {
    expect(() => loadConfig({ ...base, STORAGE_DRIVER: "ftp" })).toThrow(/STORAGE_DRIVER must be disk or s3/);
    expect(() => loadConfig({ ...base, S3_FORCE_PATH_STYLE: "yes" })).toThrow(/S3_FORCE_PATH_STYLE must be true or false/);
  });

  it("reads the S3 settings, with us-east-1 and path-style addressing by default", () => {
    const config = loadConfig({
      ...base,
      STORAGE_DRIVER: "s3",
      S3_ENDPOINT: "http://127.0.0.1:18900",
      S3_BUCKET: "dewline-photos",
      S3_ACCESS_KEY_ID: "id",
      S3_SECRET_ACCESS_KEY: "secret",
    });
    expect(config.storage).toEqual({
      driver: "s3",
      endpoint: "http://127.0.0.1:18900",
      region: "us-east-1",
      bucket: "dewline-photos",
      accessKeyId: "id",
      secretAccessKey: "secret",
      forcePathStyle: true,
    });
    expect(loadConfig({ ...base, S3_FORCE_PATH_STYLE: "false" }).storage.driver).toBe("disk");
  });
});
