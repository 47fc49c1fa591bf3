import { rm } from "node:fs/promises";
import path from "node:path";
import type { DataSource } from "typeorm";
import type { Config } from "../../config/env.js";
import { AppError, NotFoundError, ValidationError } from "../../lib/errors.js";
import type { Actor } from "../auth/actor.js";
import type { CaseService } from "../cases/case.service.js";
import { Photo } from "./photo.entity.js";
import { processPhoto, removeProcessed, type ProcessedPhoto } from "./photo-processing.js";

export const MAX_PHOTOS_PER_UPLOAD = 10;
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;

export interface UploadedFile {
  /** multer's temporary file; removed here whatever happens. */
  path: string;
  /** The name the browser sent: only ever echoed back in a refusal, never used as a path. */
  originalname?: string;
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

export class PhotoService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly cases: CaseService,
  ) {}

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
    try {
      if (files.length === 0)
        throw new ValidationError("photos: choose at least one photo.", [
          { field: "photos", message: "Choose at least one photo." },
        ]);
      const c = await this.cases.getForActor(actor, caseId);
      // Folder names are our ids; file names are random. Nothing the browser sent becomes a path.
      const dir = path.join(this.config.uploadsDir, String(c.organisationId), String(c.id));
      let firstRefusal: AppError | null = null;
      for (const [index, file] of files.entries()) {
        try {
          written.push(await processPhoto(file.path, dir));
        } catch (error) {
          if (!(error instanceof AppError) || error.status >= 500) throw error;
          firstRefusal ??= error;
          refused.push({ name: shownName(file, index), reason: error.message });
        }
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
            await removeProcessed(p);
            if (!out.some((o) => o.id === existing.id)) out.push(existing);
            continue;
          }
          const saved = await repo.save(
            repo.create({
              organisationId: c.organisationId,
              caseId: c.id,
              workOrderId: options.workOrderId ?? null,
              uploadedById: actor.id,
              displayPath: path.relative(this.config.uploadsDir, p.displayFile),
              thumbnailPath: path.relative(this.config.uploadsDir, p.thumbnailFile),
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
      await Promise.all(written.map(removeProcessed));
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

  /** The file of a photo the actor may see (through its case), as an absolute path. */
  async fileFor(actor: Actor, photoId: number, variant: "display" | "thumbnail"): Promise<string> {
    const photo = await this.dataSource.getRepository(Photo).findOneBy({ id: photoId });
    if (!photo) throw new NotFoundError("No such photo.");
    await this.cases.getForActor(actor, photo.caseId).catch(() => {
      throw new NotFoundError("No such photo.");
    });
    return path.join(this.config.uploadsDir, variant === "display" ? photo.displayPath : photo.thumbnailPath);
  }
}
