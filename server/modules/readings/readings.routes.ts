import { rm } from "node:fs/promises";
import {
  importPreviewResponse,
  importResultResponse,
  readingsAddedResponse,
  readingsResponse,
} from "../../../src/lib/contracts/readings.js";
import { READING_EXPORT_COLUMNS } from "../../../src/lib/contracts/exports.js";
import { shaped } from "../../lib/contract.js";
import type { Clock } from "../../lib/clock.js";
import { EXPORT_PAGE_SIZE, keysetPages, newPageTimes, sendTableExport } from "../../lib/table-export.js";
import { mkdirSync } from "node:fs";
import { Router, type RequestHandler } from "express";
import multer from "multer";
import { parse } from "../../lib/validation.js";
import { ServiceUnavailableError, ValidationError } from "../../lib/errors.js";
import { actorOf, requireStaff } from "../../middleware/auth.js";
import type { CaseService } from "../cases/case.service.js";
import type { Actor } from "../auth/actor.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import type { ReadingImportService } from "./reading-import.service.js";
import type { ReadingService } from "./reading.service.js";
import { requireRoomOfCase } from "./room-of-case.js";
import {
  importFieldsSchema,
  importParamsSchema,
  manualReadingsSchema,
  readingsExportQuerySchema,
  readingsQuerySchema,
} from "./readings.schemas.js";

/** A logger export of a year at one-minute intervals is ~30 MB; allow generous headroom. */
const MAX_CSV_BYTES = 200 * 1024 * 1024;

interface Deps {
  cases: CaseService;
  readings: ReadingService;
  imports: ReadingImportService;
  /** Tells officers when the new readings make the case risky (EvaluationService; readings depend on no evaluation code). */
  evaluation: { alertIfRisky(actor: Actor, caseId: number): Promise<void> };
  /** Where multer writes the CSV while it is received: the app's own `<UPLOADS_DIR>/.incoming` (swept at start-up). */
  incomingDir: string;
  clock: Clock;
}

/** File-system failures that mean "cannot store now", not "your upload is bad". */
const STORAGE_CODES = new Set(["ENOSPC", "EDQUOT", "EACCES", "EPERM", "EROFS", "ENOTDIR", "ENOENT", "EMFILE", "EIO"]);

/** multer for one "file" field into `incomingDir`; a failed write is 503 (multer removes a failed request's file). */
function csvUploadInto(incomingDir: string): RequestHandler {
  mkdirSync(incomingDir, { recursive: true });
  const receive = multer({ dest: incomingDir, limits: { fileSize: MAX_CSV_BYTES, files: 1, fields: 10 } }).single("file");
  return (req, res, next) => {
    receive(req, res, (err?: unknown) => {
      if (!err) return next();
      const code = (err as { code?: unknown }).code;
      if (typeof code === "string" && STORAGE_CODES.has(code)) {
        req.log?.error({ err }, "a readings upload could not be written to the incoming folder");
        return next(new ServiceUnavailableError("The file could not be stored just now. Please try again in a minute."));
      }
      next(err);
    });
  };
}

/** Mounted at /api/cases: `/:id/readings…` (the evaluation is in evaluation.routes.ts). */
export function createReadingsRouter({ cases, readings, imports, evaluation, incomingDir, clock }: Deps): Router {
  const router = Router();
  const csvUpload = csvUploadInto(incomingDir);

  /** Checks the case and the room before anything is uploaded; puts the case on res.locals. */
  const caseAccess: RequestHandler = async (req, res, next) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.locals.case = await cases.getForActor(actorOf(req), id);
    next();
  };

  router.get("/:id/readings", caseAccess, async (req, res) => {
    const { roomId } = parse(readingsQuerySchema, req.query, "query");
    const rows = await readings.list(res.locals.case.id, { roomId, limit: 50_000, newest: true });
    res.json(shaped(readingsResponse, { readings: rows.map((r) => ({ ...r, takenAt: r.takenAt.toISOString() })) }));
  });

  // Staff: every reading of the case (or of one room), oldest first, as CSV or .xlsx.
  router.get("/:id/readings/export", requireStaff, caseAccess, async (req, res) => {
    const { roomId, format } = parse(readingsExportQuerySchema, req.query, "query");
    const c = res.locals.case;
    const roomNames = new Map(cases.roomsOf(c).map((r) => [r.id, r.name]));
    const times = newPageTimes();
    await sendTableExport(res, {
      format,
      view: `readings-${c.reference ?? c.id}`,
      now: clock.now(),
      columns: READING_EXPORT_COLUMNS,
      times,
      // Keyset on (taken_at, room_id): one reading per room and moment, so the pair is the row's key.
      pages: keysetPages(
        async (after, limit) => {
          const rows = await readings.listAfter(c.id, {
            roomId,
            after: after ? { takenAt: after[0] as Date, roomId: after[1] as number } : undefined,
            limit,
          });
          const tail = rows.at(-1);
          return {
            rows: rows.map((r) => ({
              ...r,
              takenAt: r.takenAt.toISOString(),
              roomName: roomNames.get(r.roomId) ?? `Room ${r.roomId}`,
            })),
            last: tail ? [tail.takenAt, tail.roomId] : null,
          };
        },
        EXPORT_PAGE_SIZE,
        times,
      ),
    });
  });

  router.post("/:id/readings", caseAccess, async (req, res) => {
    const input = parse(manualReadingsSchema, req.body);
    const c = res.locals.case;
    requireRoomOfCase(
      input.map((r) => r.roomId),
      cases.roomsOf(c),
    );
    const result = await readings.addManual(
      c.id,
      input.map((r) => ({ ...r, takenAt: new Date(r.takenAt) })),
      { actorId: actorOf(req).id },
    );
    await evaluation.alertIfRisky(actorOf(req), c.id);
    res.status(201).json(shaped(readingsAddedResponse, { ...result, rejected: 0 }));
  });

  router.post("/:id/readings/import/preview", caseAccess, csvUpload, async (req, res) => {
    const file = req.file;
    if (!file) throw new ValidationError("file: choose a CSV file.", [{ field: "file", message: "Choose a CSV file." }]);
    let preview;
    try {
      preview = await imports.preview(file.path);
    } finally {
      // Removed before the answer, whatever happened.
      await rm(file.path, { force: true });
    }
    res.json(shaped(importPreviewResponse, preview));
  });

  router.post("/:id/readings/import", caseAccess, csvUpload, async (req, res) => {
    const file = req.file;
    let result;
    try {
      if (!file) throw new ValidationError("file: choose a CSV file.", [{ field: "file", message: "Choose a CSV file." }]);
      const fields = parse(importFieldsSchema, req.body);
      const c = res.locals.case;
      requireRoomOfCase([fields.roomId], cases.roomsOf(c));
      result = await imports.import({
        caseId: c.id,
        roomId: fields.roomId,
        actorId: actorOf(req).id,
        filePath: file.path,
        fileName: file.originalname,
        mapping: fields.mapping as never,
      });
    } finally {
      // Removed before the answer, whatever happened.
      if (file) await rm(file.path, { force: true });
    }
    await evaluation.alertIfRisky(actorOf(req), res.locals.case.id);
    res.status(201).json(shaped(importResultResponse, result));
  });

  router.get("/:id/readings/imports/:importId/rejected.csv", async (req, res) => {
    const { id, importId } = parse(importParamsSchema, req.params, "params");
    const c = await cases.getForActor(actorOf(req), id);
    const csv = await imports.rejectedReport(c.id, importId);
    res.type("text/csv").attachment(`rejected-rows-import-${importId}.csv`).send(csv);
  });

  return router;
}
