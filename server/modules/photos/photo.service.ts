import { rm, stat } from "node:fs/promises";
import { LessThan, MoreThan, type DataSource } from "typeorm";
import type { Config } from "../../config/env.js";
import type { Clock } from "../../lib/clock.js";
import {
  AppError,
  NotFoundError,
  PayloadTooLargeError,
  ServiceUnavailableError,
  TooManyRequestsError,
  ValidationError,
} from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { ObjectNotFoundError, type ObjectStore, type StoredObject } from "../../lib/storage.js";
import type { WorkerPool } from "../../workers/pool.js";
import type { Actor } from "../auth/actor.js";
import type { CaseService } from "../cases/case.service.js";
import { incomingDir } from "../cases/upload-dir.js";
import { Photo } from "./photo.entity.js";
import { PhotoUploadUsage } from "./photo-upload-usage.entity.js";
import {
  claimedPixels,
  MAX_INPUT_PIXELS,
  PhotoStorageError,
  refusalError,
  removeProcessed,
  storeDecoded,
  type DecodedPhoto,
  type ProcessedPhoto,
} from "./photo-processing.js";

export const MAX_PHOTOS_PER_UPLOAD = 10;
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;

export interface UploadedFile {
  /** multer's temporary file; removed here whatever happens. */
  path: string;
  /** The name the browser sent: only ever echoed back in a refusal, never used as a path. */
  originalname?: string;
  /** Bytes received (multer knows; read from the file when not given). */
  size?: number;
}

/** A file of the batch that was not stored, and why (in words for the person who chose it). */
export interface RefusedFile {
  name: string;
  reason: string;
}

export interface PhotoBatchResult {
  /** Stored now, or already on the case (the same photo sent again). */
  photos: Photo[];
  refused: RefusedFile[];
}

/** The browser's file name as shown back to its sender: the last path part, at most 120 characters. */
const shownName = (file: UploadedFile, index: number): string => {
  const base = (file.originalname ?? "").split(/[\\/]/).pop()?.trim() ?? "";
  return base ? base.slice(0, 120) : `File ${index + 1}`;
};

const HOUR_MS = 3_600_000;
const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);

/** Lets at most `limit` decodes run at once and `maxWaiting` wait; more are refused with 503. */
class DecodeGate {
  running = 0;
  private readonly waiting: (() => void)[] = [];
  constructor(
    private readonly limit: number,
    private readonly maxWaiting: number,
  ) {}

  async run<T>(work: () => Promise<T>): Promise<T> {
    if (this.running >= this.limit) {
      if (this.waiting.length >= this.maxWaiting)
        throw new ServiceUnavailableError("Many photos are being processed just now. Please try again in a moment.", 10);
      await new Promise<void>((resolve) => this.waiting.push(resolve));
    }
    this.running++;
    try {
      return await work();
    } finally {
      this.running--;
      this.waiting.shift()?.();
    }
  }
}

export class PhotoService {
  /** Photos decode on the worker pool, and on at most half its threads, so other heavy work still gets one. */
  private readonly decodes: DecodeGate;

  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly cases: CaseService,
    private readonly workers: WorkerPool,
    private readonly logger: Logger,
    private readonly clock: Clock,
    /** Where the display copies and thumbnails are kept (disk or S3); uploads wait on local disk first. */
    private readonly store: ObjectStore,
  ) {
    const limit = Math.max(1, Math.ceil(config.workers.threads / 2));
    this.decodes = new DecodeGate(limit, limit * 8);
  }

  /** Where multer puts uploads until they are processed: inside the uploads folder, on local disk whatever the store. */
  get incomingDir(): string {
    return incomingDir(this.config.uploadsDir);
  }

  /** Photos being decoded on a worker thread right now. */
  get decodesInFlight(): number {
    return this.decodes.running;
  }

  private decode(source: string): Promise<DecodedPhoto> {
    return this.decodes.run(() => this.workers.run("decodePhoto", { source }));
  }

  /**
   * Books what a request asks to decode against its sender's budget for the last hour, or refuses
   * it with 429 and Retry-After. The booking is written first and the window summed after, so two
   * requests at once on different instances cannot both slip under the budget. Answers the booking's id.
   */
  private async book(userId: number, want: { pixels: number; bytes: number }): Promise<number> {
    const repo = this.dataSource.getRepository(PhotoUploadUsage);
    const now = this.clock.now();
    const since = new Date(now.getTime() - HOUR_MS);
    await repo.delete({ userId, createdAt: LessThan(since) });
    const mine = await repo.save(repo.create({ userId, pixels: want.pixels, bytes: want.bytes, createdAt: now }));
    const rows = await repo.find({ where: { userId, createdAt: MoreThan(since) }, order: { createdAt: "ASC", id: "ASC" } });
    const budget = this.config.uploads;
    const fits = (pixels: number, bytes: number) => pixels <= budget.pixelsPerHour && bytes <= budget.bytesPerHour;
    if (fits(sum(rows.map((r) => r.pixels)), sum(rows.map((r) => r.bytes)))) return mine.id;

    await repo.delete({ id: mine.id });
    // The request fits once enough of the earlier uploads have left the hour.
    let pixels = want.pixels;
    let bytes = want.bytes;
    const earlier = rows.filter((r) => r.id !== mine.id);
    for (const r of earlier) {
      pixels += r.pixels;
      bytes += r.bytes;
    }
    let fitsAt = now.getTime() + HOUR_MS;
    for (const r of earlier) {
      if (fits(pixels, bytes)) break;
      pixels -= r.pixels;
      bytes -= r.bytes;
      fitsAt = r.createdAt.getTime() + HOUR_MS;
    }
    const seconds = Math.min(3600, Math.max(1, Math.ceil((fitsAt - now.getTime()) / 1000)));
    const minutes = Math.max(1, Math.ceil(seconds / 60));
    throw new TooManyRequestsError(
      `You have reached the photo upload limit for one hour. Please try again in ${minutes === 1 ? "a minute" : `about ${minutes} minutes`}.`,
      seconds,
    ).saying({ id: "photos-hourly-limit", values: { minutes } });
  }

  /**
   * Adds photos to a case, each on its own: a file that cannot be read is refused with its reason
   * and the others are stored. When none can be stored, the first refusal is thrown (415 or 422)
   * with every file's reason in `details.refused`. A photo already on the case (same stored bytes)
   * is not stored twice; its existing record is returned.
   */
  async addToCase(
    actor: Actor,
    caseId: number,
    files: UploadedFile[],
    options: { workOrderId?: number } = {},
  ): Promise<PhotoBatchResult> {
    const written: ProcessedPhoto[] = [];
    const refused: RefusedFile[] = [];
    let booking: number | null = null;
    try {
      if (files.length === 0)
        throw new ValidationError("photos: choose at least one photo.", [
          { field: "photos", message: "Choose at least one photo." },
        ]);
      const c = await this.cases.getForActor(actor, caseId);
      // Key prefixes are our ids; names are random. Nothing the browser sent becomes a key.
      const prefix = `${c.organisationId}/${c.id}`;
      // What the request asks to decode, from the images' headers only (too large ones are refused unread).
      const pixels = (await Promise.all(files.map((f) => claimedPixels(f.path)))).filter((p) => p <= MAX_INPUT_PIXELS);
      const bytes = await Promise.all(files.map(async (f) => f.size ?? (await stat(f.path)).size));
      if (sum(pixels) > this.config.uploads.pixelsPerRequest) {
        const most = Math.floor(this.config.uploads.pixelsPerRequest / 1_000_000);
        throw new PayloadTooLargeError(
          `These photos together have too many pixels to process at once (at most ${most} megapixels in one upload). Please send fewer at a time.`,
        ).saying({ id: "photos-too-many-pixels", values: { most } });
      }
      booking = await this.book(actor.id, { pixels: sum(pixels), bytes: sum(bytes) });
      let firstRefusal: AppError | null = null;
      for (const [index, file] of files.entries()) {
        const decoded = await this.decode(file.path);
        if (decoded.ok) {
          written.push(await storeDecoded(decoded, this.store, prefix));
          continue;
        }
        const error = refusalError(decoded.refusal);
        firstRefusal ??= error;
        refused.push({ name: shownName(file, index), reason: error.message });
      }
      if (written.length === 0 && firstRefusal) {
        const message =
          refused.length === 1
            ? firstRefusal.message
            : `None of the ${refused.length} files could be added. ${refused.map((r) => `${r.name}: ${r.reason}`).join(" ")}`;
        throw new AppError(firstRefusal.status, firstRefusal.code, message, { refused });
      }
      const result = await this.dataSource.transaction(async (m) => {
        const repo = m.getRepository(Photo);
        const out: Photo[] = [];
        const added: number[] = [];
        for (const p of written) {
          const existing = await repo.findOneBy({ caseId: c.id, sha256: p.sha256 });
          if (existing) {
            await removeProcessed(this.store, p);
            if (!out.some((o) => o.id === existing.id)) out.push(existing);
            continue;
          }
          const saved = await repo.save(
            repo.create({
              organisationId: c.organisationId,
              caseId: c.id,
              workOrderId: options.workOrderId ?? null,
              uploadedById: actor.id,
              displayPath: p.displayKey,
              thumbnailPath: p.thumbnailKey,
              width: p.width,
              height: p.height,
              bytes: p.bytes,
              sha256: p.sha256,
            }),
          );
          out.push(saved);
          added.push(saved.id);
        }
        if (added.length)
          await this.cases.recordEvent(m, {
            caseId: c.id,
            actorId: actor.id,
            type: "photos-added",
            after: { photoIds: added, workOrderId: options.workOrderId ?? null },
          });
        return out;
      });
      return { photos: result, refused };
    } catch (error) {
      await Promise.all(written.map((p) => removeProcessed(this.store, p).catch(() => undefined)));
      // A failure of ours (storage, database, a busy pool) does not spend the sender's budget.
      if (booking !== null && !(error instanceof AppError && error.status < 500))
        await this.dataSource
          .getRepository(PhotoUploadUsage)
          .delete({ id: booking })
          .catch(() => undefined);
      if (error instanceof PhotoStorageError) this.logger.error({ err: error.fault, caseId }, "a photo could not be stored");
      throw error;
    } finally {
      await Promise.all(files.map((f) => rm(f.path, { force: true })));
    }
  }

  /** Per case: how many photos and the first one, for lists (cases already checked by the caller). */
  async summaries(caseIds: number[]): Promise<Map<number, { count: number; firstId: number }>> {
    if (caseIds.length === 0) return new Map();
    const rows: { caseId: number; count: string; firstId: number }[] = await this.dataSource
      .getRepository(Photo)
      .createQueryBuilder("p")
      .select("p.case_id", "caseId")
      .addSelect("COUNT(*)", "count")
      .addSelect("MIN(p.id)", "firstId")
      .where("p.case_id IN (:...caseIds)", { caseIds })
      .groupBy("p.case_id")
      .getRawMany();
    return new Map(rows.map((r) => [Number(r.caseId), { count: Number(r.count), firstId: Number(r.firstId) }]));
  }

  async listForCase(actor: Actor, caseId: number): Promise<Photo[]> {
    const c = await this.cases.getForActor(actor, caseId);
    return this.dataSource.getRepository(Photo).find({ where: { caseId: c.id }, order: { id: "ASC" } });
  }

  /**
   * A stored copy of a photo the actor may see (through its case), as a stream with its type and
   * size; 404 when the photo is not theirs or its object has gone from the store.
   */
  async open(actor: Actor, photoId: number, variant: "display" | "thumbnail"): Promise<StoredObject> {
    const key = await this.keyFor(actor, photoId, variant);
    try {
      return await this.store.get(key);
    } catch (error) {
      throw this.readFault(error, photoId, key);
    }
  }

  /** The same as open(), as bytes in memory (one display copy is at most a few hundred kB). */
  async bytes(actor: Actor, photoId: number, variant: "display" | "thumbnail"): Promise<Buffer> {
    const key = await this.keyFor(actor, photoId, variant);
    try {
      return await this.store.read(key);
    } catch (error) {
      throw this.readFault(error, photoId, key);
    }
  }

  private async keyFor(actor: Actor, photoId: number, variant: "display" | "thumbnail"): Promise<string> {
    const photo = await this.dataSource.getRepository(Photo).findOneBy({ id: photoId });
    if (!photo) throw new NotFoundError("No such photo.");
    await this.cases.getForActor(actor, photo.caseId).catch(() => {
      throw new NotFoundError("No such photo.");
    });
    return variant === "display" ? photo.displayPath : photo.thumbnailPath;
  }

  /** A missing object is the photo's own 404; any other failure of the store (unreachable, refusing) is a 503. */
  private readFault(error: unknown, photoId: number, key: string): AppError {
    if (error instanceof ObjectNotFoundError) {
      this.logger.warn({ photoId, key, store: this.store.driver }, "a photo's file is missing from the photo store");
      return new NotFoundError("This photo's file is missing. Please tell your landlord's support team.");
    }
    this.logger.error({ err: error, photoId, key, store: this.store.driver }, "the photo store could not be read");
    return new ServiceUnavailableError("Photos cannot be shown just now. Please try again in a few minutes.", 30);
  }
}
