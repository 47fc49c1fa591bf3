// Object storage for the files the app keeps (photos today): one interface, two implementations.
// DiskObjectStore keeps objects as files under one folder (the default: UPLOADS_DIR, today's layout);
// S3ObjectStore keeps them in an S3-compatible bucket through @aws-sdk/client-s3. Callers name
// objects by key ("<organisation>/<case>/<random>.jpg") and never see a path or a bucket.
import { randomBytes } from "node:crypto";
import { mkdir, open, readdir, readFile, rename, rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";
import type { S3StoreOptions, StorageConfig } from "../config/env.js";

export interface PutOptions {
  contentType: string;
  /** The body's length in bytes, when it is a stream and the length is known (S3 then streams it through). */
  size?: number;
}

export interface StoredObject {
  body: Readable;
  contentType: string;
  size: number;
}

export interface ListedObject {
  key: string;
  size: number;
}

export interface ObjectStore {
  /** "disk" or "s3": for logs and the operator's messages only; callers never branch on it. */
  readonly driver: "disk" | "s3";
  /** Stores `body` under `key`, replacing what was there; a reader sees the old object or the whole new one. */
  put(key: string, body: Buffer | Readable, options: PutOptions): Promise<void>;
  /** The object as a stream; ObjectNotFoundError when there is none. */
  get(key: string): Promise<StoredObject>;
  /** The object's bytes in memory (for small objects); ObjectNotFoundError when there is none. */
  read(key: string): Promise<Buffer>;
  exists(key: string): Promise<boolean>;
  /** Removes the object; removing one that is not there is not an error. */
  delete(key: string): Promise<void>;
  /** Every object whose key starts with `prefix` (a plain string prefix, as in S3), in key order. */
  list(prefix?: string): Promise<ListedObject[]>;
  /** Lets go of connections (S3); the store is not used after. */
  close(): Promise<void>;
}

/** The object asked for is not in the store. */
export class ObjectNotFoundError extends Error {
  readonly code = "object_not_found";
  constructor(readonly key: string) {
    super(`No object "${key}" in the store.`);
    this.name = "ObjectNotFoundError";
  }
}

/** A key that could escape the store's folder or that one of the stores could not hold as given. */
export class InvalidObjectKeyError extends Error {
  readonly code = "invalid_object_key";
  constructor(readonly key: string) {
    super(
      `Not a valid object key: ${JSON.stringify(key)}. Keys are relative, "/"-separated, and each part starts with a letter or digit (no "..", no leading "/", no "\\").`,
    );
    this.name = "InvalidObjectKeyError";
  }
}

// Each part starts with a letter or digit, so "..", ".", hidden names (the disk store's own
// ".incoming" and content-type notes) and empty parts ("a//b", a leading "/") are all refused.
const KEY_PART = /^[A-Za-z0-9][A-Za-z0-9._-]*$/;
export const MAX_KEY_LENGTH = 512;

/** Throws InvalidObjectKeyError unless `key` is one every store holds under that exact name. */
export function checkKey(key: string): string {
  if (typeof key !== "string" || key.length === 0 || key.length > MAX_KEY_LENGTH) throw new InvalidObjectKeyError(key);
  if (!key.split("/").every((part) => KEY_PART.test(part))) throw new InvalidObjectKeyError(key);
  return key;
}

/** A prefix for list(): a key, or the start of one (may end with "/"); "" lists everything. */
function checkPrefix(prefix: string): string {
  if (prefix === "") return prefix;
  checkKey(prefix.endsWith("/") ? prefix.slice(0, -1) : prefix);
  return prefix;
}

const TYPES_BY_EXTENSION: Record<string, string> = {
  ".jpg": "image/jpeg",
  ".jpeg": "image/jpeg",
  ".png": "image/png",
  ".webp": "image/webp",
  ".avif": "image/avif",
  ".pdf": "application/pdf",
  ".json": "application/json",
  ".csv": "text/csv",
  ".txt": "text/plain",
  ".zip": "application/zip",
  ".gz": "application/gzip",
};
const DEFAULT_TYPE = "application/octet-stream";
const typeOfName = (name: string): string => TYPES_BY_EXTENSION[path.extname(name).toLowerCase()] ?? DEFAULT_TYPE;

const isMissing = (error: unknown): boolean => {
  const code = (error as { code?: unknown }).code;
  return code === "ENOENT" || code === "EISDIR" || code === "ENOTDIR";
};

async function toBuffer(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of body) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array));
  return Buffer.concat(chunks);
}

/**
 * Objects as files under `root`: key "a/b.jpg" is the file root/a/b.jpg, so the photo store keeps
 * the layout it has always had. Each write goes to a temporary file in root/.incoming (same disk,
 * swept of a crash's leftovers at start-up) and is renamed into place once complete, so a reader
 * never sees half a file and a failed write leaves nothing behind.
 *
 * A file's content type is read from its name's extension (.jpg → image/jpeg); only when an object
 * was stored with another type is it noted beside the file, in ".<name>.content-type".
 */
export class DiskObjectStore implements ObjectStore {
  readonly driver = "disk";
  private readonly tempDir: string;

  constructor(readonly root: string) {
    this.root = path.resolve(root);
    this.tempDir = path.join(this.root, ".incoming");
  }

  private fileOf(key: string): string {
    return path.join(this.root, ...checkKey(key).split("/"));
  }

  private noteOf(file: string): string {
    return path.join(path.dirname(file), `.${path.basename(file)}.content-type`);
  }

  async put(key: string, body: Buffer | Readable, options: PutOptions): Promise<void> {
    const file = this.fileOf(key);
    const temp = path.join(this.tempDir, `${randomBytes(16).toString("hex")}.part`);
    const note = this.noteOf(file);
    const noted = options.contentType !== typeOfName(file);
    try {
      await mkdir(this.tempDir, { recursive: true });
      await mkdir(path.dirname(file), { recursive: true });
      if (Buffer.isBuffer(body)) await writeFile(temp, body, { flag: "wx" });
      else {
        const handle = await open(temp, "wx");
        await pipeline(body, handle.createWriteStream());
      }
      if (noted) await writeFile(note, options.contentType, "utf8");
      await rename(temp, file);
      if (!noted) await rm(note, { force: true });
    } catch (error) {
      await rm(temp, { force: true }).catch(() => undefined);
      throw error;
    }
  }

  private async contentTypeOf(file: string): Promise<string> {
    try {
      return (await readFile(this.noteOf(file), "utf8")).trim() || typeOfName(file);
    } catch {
      return typeOfName(file);
    }
  }

  async get(key: string): Promise<StoredObject> {
    const file = this.fileOf(key);
    let handle;
    try {
      handle = await open(file, "r");
    } catch (error) {
      if (isMissing(error)) throw new ObjectNotFoundError(key);
      throw error;
    }
    try {
      const info = await handle.stat();
      if (!info.isFile()) throw new ObjectNotFoundError(key);
      // The stream owns the open handle from here: the file may be replaced or removed meanwhile,
      // and the reader still gets the whole object it opened.
      return { body: handle.createReadStream(), contentType: await this.contentTypeOf(file), size: info.size };
    } catch (error) {
      await handle.close();
      throw error;
    }
  }

  async read(key: string): Promise<Buffer> {
    try {
      return await readFile(this.fileOf(key));
    } catch (error) {
      if (isMissing(error)) throw new ObjectNotFoundError(key);
      throw error;
    }
  }

  async exists(key: string): Promise<boolean> {
    return stat(this.fileOf(key))
      .then((s) => s.isFile())
      .catch((error: unknown) => {
        if (isMissing(error)) return false;
        throw error;
      });
  }

  async delete(key: string): Promise<void> {
    const file = this.fileOf(key);
    await rm(file, { force: true });
    await rm(this.noteOf(file), { force: true });
  }

  async list(prefix = ""): Promise<ListedObject[]> {
    checkPrefix(prefix);
    // Walk only the folder the prefix names (its part before the last "/"), then match by string.
    const cut = prefix.lastIndexOf("/");
    const base = cut < 0 ? "" : prefix.slice(0, cut);
    const out: ListedObject[] = [];
    const walk = async (rel: string): Promise<void> => {
      let entries;
      try {
        entries = await readdir(path.join(this.root, ...(rel ? rel.split("/") : [])), { withFileTypes: true });
      } catch (error) {
        if (isMissing(error)) return;
        throw error;
      }
      for (const e of entries) {
        // Hidden names (.incoming, content-type notes) are the store's own, never objects.
        if (!KEY_PART.test(e.name)) continue;
        const key = rel ? `${rel}/${e.name}` : e.name;
        if (e.isDirectory()) {
          if (key.startsWith(prefix) || prefix.startsWith(`${key}/`)) await walk(key);
        } else if (e.isFile() && key.startsWith(prefix)) {
          out.push({ key, size: (await stat(path.join(this.root, ...key.split("/")))).size });
        }
      }
    };
    await walk(base);
    return out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  }

  async close(): Promise<void> {}
}

const statusOf = (error: unknown): number | undefined =>
  (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
const isNotFound = (error: unknown): boolean => {
  const name = (error as { name?: unknown }).name;
  return name === "NoSuchKey" || name === "NotFound" || statusOf(error) === 404;
};

/**
 * Objects in one bucket of an S3-compatible service. GET answers the response stream as it arrives
 * (nothing held in memory). A stream given to put() without its size is read into memory first: a
 * single PUT needs the length up front (photos are always given as buffers).
 */
export class S3ObjectStore implements ObjectStore {
  readonly driver = "s3";
  readonly bucket: string;
  private readonly client: S3Client;

  constructor(options: S3StoreOptions) {
    this.bucket = options.bucket;
    this.client = new S3Client({
      endpoint: options.endpoint,
      region: options.region,
      forcePathStyle: options.forcePathStyle,
      credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey },
      // Checksums only where the API requires them: the newer default sends streamed bodies in
      // aws-chunked framing with trailing checksums, which older S3-compatible servers do not all
      // understand. Integrity is still checked end to end by the callers' own SHA-256 (photos).
      requestChecksumCalculation: "WHEN_REQUIRED",
      responseChecksumValidation: "WHEN_REQUIRED",
      maxAttempts: 3,
    });
  }

  async put(key: string, body: Buffer | Readable, options: PutOptions): Promise<void> {
    checkKey(key);
    const known = Buffer.isBuffer(body) ? body.length : options.size;
    const payload = known === undefined ? await toBuffer(body as Readable) : body;
    await this.client.send(
      new PutObjectCommand({
        Bucket: this.bucket,
        Key: key,
        Body: payload,
        ContentType: options.contentType,
        ContentLength: Buffer.isBuffer(payload) ? payload.length : known,
      }),
    );
  }

  async get(key: string): Promise<StoredObject> {
    checkKey(key);
    try {
      const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
      if (!(out.Body instanceof Readable)) throw new Error("The S3 client answered a body that is not a Node stream.");
      return { body: out.Body, contentType: out.ContentType ?? typeOfName(key), size: out.ContentLength ?? 0 };
    } catch (error) {
      if (isNotFound(error)) throw new ObjectNotFoundError(key);
      throw error;
    }
  }

  async read(key: string): Promise<Buffer> {
    return toBuffer((await this.get(key)).body);
  }

  async exists(key: string): Promise<boolean> {
    checkKey(key);
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
      return true;
    } catch (error) {
      if (isNotFound(error)) return false;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    checkKey(key);
    // S3 answers 204 whether or not the key was there.
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  async list(prefix = ""): Promise<ListedObject[]> {
    checkPrefix(prefix);
    const out: ListedObject[] = [];
    let token: string | undefined;
    do {
      const page = await this.client.send(
        new ListObjectsV2Command({ Bucket: this.bucket, Prefix: prefix || undefined, ContinuationToken: token }),
      );
      for (const o of page.Contents ?? []) if (o.Key) out.push({ key: o.Key, size: o.Size ?? 0 });
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    return out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  }

  async close(): Promise<void> {
    this.client.destroy();
  }
}

/** The store the configuration names (Config.storage). */
export function createObjectStore(config: StorageConfig): ObjectStore {
  return config.driver === "s3" ? new S3ObjectStore(config) : new DiskObjectStore(config.root);
}
