import { mkdirSync } from "node:fs";
import { rm } from "node:fs/promises";
import { Router, type RequestHandler } from "express";
import multer from "multer";
import { stringify } from "csv-stringify/sync";
import {
  TENANCY_IMPORT_MAX_MB,
  TENANCY_IMPORT_NOTABLE_ROWS,
  tenancyImportListResponse,
  tenancyImportPreviewResponse,
  tenancyImportResultResponse,
} from "../../../src/lib/contracts/tenancy-import.js";
import { shaped } from "../../lib/contract.js";
import { ValidationError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import type { InvitationBatchService } from "../auth/invitation-batch.service.js";
import { idParamsSchema } from "../properties/properties.schemas.js";
import { tenancyImportFieldsSchema } from "./tenancy-import.schemas.js";
import { notableRows, type TenancyImportService } from "./tenancy-import.service.js";

/** A tenancy file of 50 000 rows is a few MB; an .xlsx with styling more. */
const MAX_FILE_BYTES = TENANCY_IMPORT_MAX_MB * 1024 * 1024;

/** A cell a spreadsheet would run as a formula (=, +, -, @, or a tab/CR before one) is written as text. */
const safeCell = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v);

const noFile = () =>
  new ValidationError("file: choose a CSV or .xlsx file.", [{ field: "file", message: "Choose a CSV or .xlsx file." }]);

interface Deps {
  imports: TenancyImportService;
  batches: InvitationBatchService;
  /** Where multer writes the file while it is received (the app's `<UPLOADS_DIR>/.incoming`). */
  incomingDir: string;
}

/** Mounted at /api/tenancy-imports: admins bring in a tenancy file and follow its invitations. */
export function createTenancyImportRouter({ imports, batches, incomingDir }: Deps): Router {
  const router = Router();
  mkdirSync(incomingDir, { recursive: true });
  const upload: RequestHandler = multer({
    dest: incomingDir,
    limits: { fileSize: MAX_FILE_BYTES, files: 1, fields: 5 },
  }).single("file");
  const admin = requireRole("admin");

  router.get("/", admin, async (req, res) => {
    res.json(shaped(tenancyImportListResponse, { items: await imports.list(actorOf(req)) }));
  });

  router.post("/preview", admin, upload, async (req, res) => {
    const file = req.file;
    if (!file) throw noFile();
    try {
      res.json(shaped(tenancyImportPreviewResponse, await imports.preview(file.path)));
    } finally {
      await rm(file.path, { force: true });
    }
  });

  router.post("/", admin, upload, async (req, res) => {
    const file = req.file;
    try {
      if (!file) throw noFile();
      const { mapping } = parse(tenancyImportFieldsSchema, req.body);
      const { report, ...summary } = await imports.import(actorOf(req), {
        path: file.path,
        fileName: file.originalname,
        mapping,
      });
      const notable = notableRows(report);
      res.status(201).json(
        shaped(tenancyImportResultResponse, {
          ...summary,
          notable: notable.slice(0, TENANCY_IMPORT_NOTABLE_ROWS),
          notableTotal: notable.length,
        }),
      );
    } finally {
      if (file) await rm(file.path, { force: true });
    }
  });

  router.get("/:id/report.csv", admin, async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const { rows } = await imports.report(actorOf(req), id);
    const csv = stringify(
      rows.map((r) => [String(r.row), safeCell(r.reference), r.outcome, r.changes.join("; "), safeCell(r.reasons.join(" "))]),
      { header: true, columns: ["row", "tenancy reference", "outcome", "changes", "reasons and notes"], bom: true },
    );
    res.type("text/csv").attachment(`tenancy-import-${id}-report.csv`).send(csv);
  });

  for (const action of ["pause", "resume", "cancel"] as const) {
    router.post(`/:id/invitations/${action}`, admin, async (req, res) => {
      const { id } = parse(idParamsSchema, req.params, "params");
      const actor = actorOf(req);
      await batches[action](actor, await imports.batchOf(actor, id));
      res.status(204).end();
    });
  }

  return router;
}
