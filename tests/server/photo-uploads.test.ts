// The photo upload pipeline under abuse and faults: damaged and oversized images, malformed
// multipart bodies, failed writes, leftovers from a crash, a per-user budget, decoding off the
// request thread, and a photo whose file has gone.
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, utimesSync, writeFileSync } from "node:fs";
import type { AddressInfo } from "node:net";
import net from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Photo } from "../../server/modules/photos/photo.entity.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { bigPng, jpegWithGps, png, pngClaiming, truncatedJpeg } from "../support/images.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

/** Every file (not folder) under `dir`, as paths relative to it; [] when it does not exist. */
function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, encoding: "utf8" }).filter((f) => statSync(path.join(dir, f)).isFile());
}

const upload = (client: Client, url: string, files: [Buffer, string][]) => {
  const req = client.agent.post(url).set("X-CSRF-Token", client.csrf);
  for (const [buf, name] of files) req.attach("photos", buf, name);
  return req;
};

async function newCase(client: Client): Promise<number> {
  const res = await client
    .post("/api/cases", { description: "Mould on the bedroom ceiling.", locations: ["ceiling"], observations: ["mould-spots"] })
    .expect(201);
  return res.body.id as number;
}

describe("photo uploads", () => {
  const uploads = mkdtempSync(path.join(tmpdir(), "dewline-test-uploads-"));
  const incoming = path.join(uploads, ".incoming");
  let t: TestApp;
  let landlord: Awaited<ReturnType<typeof makeLandlord>>;
  let tenant: Client;
  let caseId: number;
  const photoCount = () => t.ctx.dataSource.getRepository(Photo).countBy({ caseId });

  beforeAll(async () => {
    t = await createTestApp({ UPLOADS_DIR: uploads });
    landlord = await makeLandlord(t.ctx.dataSource);
    tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
    caseId = await newCase(tenant);
  });
  afterAll(async () => {
    await t.close();
    rmSync(uploads, { recursive: true, force: true });
  });

  describe("damaged and oversized images", () => {
    it("refuses a truncated JPEG as damaged or partly uploaded, storing nothing", async () => {
      const before = await photoCount();
      const res = await upload(tenant, `/api/cases/${caseId}/photos`, [[await truncatedJpeg(), "cut.jpg"]]).expect(415);
      expect(res.body.error.message).toMatch(/could not be read.*damaged or only partly uploaded/);
      expect(await photoCount()).toBe(before);
    });

    it("calls a JPEG cut off inside its header damaged too, not 'not a photo'", async () => {
      const cut = (await jpegWithGps(1200, 900, 5)).subarray(0, 300);
      const res = await upload(tenant, `/api/cases/${caseId}/photos`, [[cut, "cut-early.jpg"]]).expect(415);
      expect(res.body.error.message).toMatch(/could not be read.*damaged or only partly uploaded/);
    });

    it("tells a 900-megapixel PNG it has too many pixels (422), not that it is no photo", async () => {
      const res = await upload(tenant, `/api/cases/${caseId}/photos`, [[pngClaiming(30_000, 30_000), "huge.png"]]).expect(422);
      expect(res.body.error.message).toMatch(/too many pixels/);
    });

    it("refuses a request whose images together have too many pixels, before decoding any", async () => {
      // Each is under the per-photo limit (250 MP); together they are over the per-request one.
      const res = await upload(tenant, `/api/cases/${caseId}/photos`, [
        [pngClaiming(14_000, 14_000), "a.png"],
        [pngClaiming(14_000, 14_000), "b.png"],
      ]).expect(413);
      expect(res.body.error.message).toMatch(/too many pixels.*fewer/i);
    });
  });

  describe("malformed multipart bodies", () => {
    const boundary = "----dewline-test-boundary";
    const raw = (client: Client, body: string | Buffer) =>
      client.agent
        .post(`/api/cases/${caseId}/photos`)
        .set("X-CSRF-Token", client.csrf)
        .set("Content-Type", `multipart/form-data; boundary=${boundary}`)
        .send(Buffer.isBuffer(body) ? body : Buffer.from(body, "latin1"));

    it("answers a bad part header with 400 and a clear message", async () => {
      const res = await raw(tenant, `--${boundary}\r\nthis is not a header\r\n\r\nabc\r\n--${boundary}--\r\n`).expect(400);
      expect(res.body.error.message).toMatch(/upload could not be read/i);
    });

    it("answers a body cut off before its end with 400", async () => {
      const part = `--${boundary}\r\nContent-Disposition: form-data; name="photos"; filename="a.png"\r\nContent-Type: image/png\r\n\r\n`;
      const res = await raw(tenant, Buffer.concat([Buffer.from(part), await png(50, 50)])).expect(400);
      expect(res.body.error.message).toMatch(/upload could not be read/i);
      expect(filesUnder(incoming)).toEqual([]);
    });

    it("answers a NUL in a file name with 400, raw or percent-encoded", async () => {
      const image = await png(40, 40);
      const withName = (disposition: string) =>
        Buffer.concat([
          Buffer.from(
            `--${boundary}\r\nContent-Disposition: form-data; name="photos"; ${disposition}\r\nContent-Type: image/png\r\n\r\n`,
            "latin1",
          ),
          image,
          Buffer.from(`\r\n--${boundary}--\r\n`),
        ]);
      const before = await photoCount();
      const rawNul = await raw(tenant, withName('filename="a\u0000b.png"')).expect(400);
      expect(rawNul.body.error.message).toMatch(/upload could not be read/i);
      const encodedNul = await raw(tenant, withName("filename*=UTF-8''a%00b.png")).expect(400);
      expect(encodedNul.body.error.message).toMatch(/file name/i);
      expect(await photoCount()).toBe(before);
      expect(filesUnder(incoming)).toEqual([]);
    });

    it("answers a malformed body sent over a raw socket with 400, and keeps serving", async () => {
      const server = t.app.listen(0, "127.0.0.1");
      await new Promise((resolve) => server.once("listening", resolve));
      try {
        const { port } = server.address() as AddressInfo;
        const cookie = (tenant.agent as unknown as { jar: { getCookies(a: object): { toValueString(): string }[] } }).jar
          .getCookies({ domain: "127.0.0.1", path: "/", secure: false, script: false })
          .map((c) => c.toValueString())
          .join("; ");
        const body = `--${boundary}\r\nContent-Disposition: form-data; name="photos"; filename="x.png"\r\nBroken header line\r\n\r\n\u0000\u0001\r\n--${boundary}--\r\n`;
        const reply = await new Promise<string>((resolve, reject) => {
          const socket = net.connect(port, "127.0.0.1", () => {
            socket.write(
              [
                `POST /api/cases/${caseId}/photos HTTP/1.1`,
                `Host: 127.0.0.1:${port}`,
                `Cookie: ${cookie}`,
                `X-CSRF-Token: ${tenant.csrf}`,
                `Content-Type: multipart/form-data; boundary=${boundary}`,
                `Content-Length: ${Buffer.byteLength(body, "latin1")}`,
                "Connection: close",
                "",
                body,
              ].join("\r\n"),
              "latin1",
            );
          });
          let text = "";
          socket.on("data", (d: Buffer) => (text += d.toString("latin1")));
          socket.on("end", () => resolve(text));
          socket.on("error", reject);
        });
        expect(reply.split("\r\n")[0]).toBe("HTTP/1.1 400 Bad Request");
        expect(reply).toMatch(/content-type: application\/json/i);
        await request(server).get("/api/health").expect(200);
      } finally {
        await new Promise((resolve) => server.close(resolve));
      }
    });
  });

  describe("temporary and partial files", () => {
    it("keeps the upload's temporary files in the app's own folder, and removes them", async () => {
      await upload(tenant, `/api/cases/${caseId}/photos`, [[await png(30, 30), "ok.png"]]).expect(201);
      await upload(tenant, `/api/cases/${caseId}/photos`, [[Buffer.from("not an image"), "bad.jpg"]]).expect(415);
      expect(existsSync(incoming)).toBe(true);
      expect(filesUnder(incoming)).toEqual([]);
    });

    it("answers a destination that cannot be written with a clear error, leaving no files behind", async () => {
      const otherCase = await newCase(tenant);
      const orgDir = path.join(uploads, String(landlord.org.id));
      mkdirSync(orgDir, { recursive: true });
      // The case's folder cannot be made: a file stands in its place.
      const blocker = path.join(orgDir, String(otherCase));
      writeFileSync(blocker, "");
      try {
        const res = await upload(tenant, `/api/cases/${otherCase}/photos`, [[await jpegWithGps(600, 400, 11), "a.jpg"]]).expect(
          503,
        );
        expect(res.headers["retry-after"]).toMatch(/^\d+$/);
        expect(res.body.error.message).toMatch(/could not be stored/i);
        expect(await t.ctx.dataSource.getRepository(Photo).countBy({ caseId: otherCase })).toBe(0);
        expect(filesUnder(incoming)).toEqual([]);
      } finally {
        rmSync(blocker);
      }
    });

    // A full disk, for real: the photo store on a tiny tmpfs (needs the right to mount; root in CI).
    const mountable = (() => {
      const probe = mkdtempSync(path.join(tmpdir(), "dewline-mount-probe-"));
      try {
        execFileSync("mount", ["-t", "tmpfs", "-o", "size=64k", "tmpfs", probe], { stdio: "ignore" });
        execFileSync("umount", [probe], { stdio: "ignore" });
        return true;
      } catch {
        return false;
      } finally {
        rmSync(probe, { recursive: true, force: true });
      }
    })();

    it.runIf(mountable)("leaves no partial or empty file when the disk fills up part way through a write", async () => {
      // Noise compresses badly: its display copy is hundreds of kB, and the disk has room for the
      // upload itself and 64 kB more.
      const noisy = await truncatedJpeg(1);
      const store = mkdtempSync(path.join(tmpdir(), "dewline-test-full-"));
      const size = Math.ceil((noisy.length + 64 * 1024) / 4096) * 4096 + 16 * 4096;
      execFileSync("mount", ["-t", "tmpfs", "-o", `size=${size}`, "tmpfs", store]);
      const full = await createTestApp({ UPLOADS_DIR: store });
      const before = await photoCount();
      try {
        const client = await signedInClient(full.app, landlord.tenant.email, PASSWORD);
        const res = await upload(client, `/api/cases/${caseId}/photos`, [[noisy, "noisy.jpg"]]).expect(503);
        expect(res.body.error.message).toMatch(/could not be stored/i);
        expect(filesUnder(store)).toEqual([]);
        expect(await photoCount()).toBe(before);
      } finally {
        await full.close();
        execFileSync("umount", [store]);
        rmSync(store, { recursive: true, force: true });
      }
    });

    it("removes temporary files a crash left behind when the app starts", async () => {
      const dir = mkdtempSync(path.join(tmpdir(), "dewline-test-uploads-"));
      const leftovers = path.join(dir, ".incoming");
      mkdirSync(leftovers, { recursive: true });
      const stale = path.join(leftovers, "0123456789abcdef0123456789abcdef");
      writeFileSync(stale, "half an upload");
      // Written two hours ago by an instance that then crashed.
      const then = new Date(statSync(stale).mtimeMs - 2 * 3_600_000);
      utimesSync(stale, then, then);
      const other = await createTestApp({ UPLOADS_DIR: dir });
      try {
        expect(existsSync(stale)).toBe(false);
      } finally {
        await other.close();
        rmSync(dir, { recursive: true, force: true });
      }
    });
  });

  describe("decoding", () => {
    it("decodes a large image on a worker thread while the request thread keeps answering", async () => {
      const big = await bigPng(60);
      const completedBefore = t.ctx.workers.stats.completed;
      const photos = t.ctx.services.photos as unknown as { decodesInFlight: number };
      const order: string[] = [];
      const uploading = upload(tenant, `/api/cases/${caseId}/photos`, [[big, "big.png"]])
        .expect(201)
        .then(() => order.push("upload"));
      // Wait for the state: the decode has started.
      while (!(photos.decodesInFlight > 0)) await new Promise((r) => setTimeout(r, 5));
      await request(t.app)
        .get("/api/health")
        .expect(200)
        .then(() => order.push("health"));
      await uploading;
      expect(order).toEqual(["health", "upload"]);
      expect(t.ctx.workers.stats.completed).toBeGreaterThan(completedBefore);
    });
  });

  describe("a photo whose file has gone", () => {
    it("answers 404 with a JSON error, not 500 dressed as a JPEG", async () => {
      const res = await upload(tenant, `/api/cases/${caseId}/photos`, [[await jpegWithGps(300, 200, 21), "gone.jpg"]]).expect(
        201,
      );
      const photo = await t.ctx.dataSource.getRepository(Photo).findOneByOrFail({ id: res.body.photos[0].id });
      rmSync(path.join(uploads, photo.displayPath));
      rmSync(path.join(uploads, photo.thumbnailPath));
      for (const url of [`/api/photos/${photo.id}`, `/api/photos/${photo.id}/thumbnail`]) {
        const gone = await tenant.agent.get(url).expect(404);
        expect(gone.headers["content-type"]).toMatch(/^application\/json/);
        expect(gone.body.error.code).toBe("not_found");
      }
    });
  });
});

describe("per-user upload budget", () => {
  const uploads = mkdtempSync(path.join(tmpdir(), "dewline-test-uploads-"));
  // Two instances on one database and one photo store: the budget holds across them.
  const env = { UPLOADS_DIR: uploads, UPLOAD_MEGAPIXELS_PER_HOUR: "2" };
  let a: TestApp;
  let b: TestApp;
  afterAll(async () => {
    await a?.close();
    await b?.close();
    rmSync(uploads, { recursive: true, force: true });
  });

  it("answers 429 with Retry-After once a user's hourly budget is spent, storing nothing", async () => {
    a = await createTestApp(env);
    b = await createTestApp(env);
    const landlord = await makeLandlord(a.ctx.dataSource);
    const onA = await signedInClient(a.app, landlord.tenant.email, PASSWORD);
    const onB = await signedInClient(b.app, landlord.tenant.email, PASSWORD);
    const id = await newCase(onA);
    // 1.08 megapixels: within the budget of 2.
    await upload(onA, `/api/cases/${id}/photos`, [[await jpegWithGps(1200, 900, 1), "one.jpg"]]).expect(201);
    const count = await a.ctx.dataSource.getRepository(Photo).countBy({ caseId: id });
    const filesBefore = filesUnder(uploads);

    const res = await upload(onB, `/api/cases/${id}/photos`, [[await jpegWithGps(1200, 900, 2), "two.jpg"]]).expect(429);
    expect(Number(res.headers["retry-after"])).toBeGreaterThan(0);
    expect(Number(res.headers["retry-after"])).toBeLessThanOrEqual(3600);
    expect(res.body.error.message).toMatch(/upload limit/i);
    expect(await a.ctx.dataSource.getRepository(Photo).countBy({ caseId: id })).toBe(count);
    expect(filesUnder(uploads)).toEqual(filesBefore);

    // Another user of the same landlord has their own budget.
    const officer = await signedInClient(b.app, landlord.officer.email, PASSWORD);
    await upload(officer, `/api/cases/${id}/photos`, [[await jpegWithGps(1200, 900, 3), "three.jpg"]]).expect(201);
  });
});
