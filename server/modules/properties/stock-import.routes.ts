import { mkdirSync } from "node:fs";
import { rm } from "node:fs/promises";
import { Router, type RequestHandler } from "express";
import multer from "multer";
import {
  stockImportListResponse,
  stockImportPreviewResponse,
  stockImportResponse,
} from "../../../src/lib/contracts/stock-imports.js";
import { shaped } from "../../lib/contract.js";
import { ServiceUnavailableError, ValidationError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole } from "../../middleware/auth.js";
import { idParamsSchema, stockImportFieldsSchema } from "./properties.schemas.js";
import { toStockImportDto } from "./stock-import.mapper.js";
import type { StockImportService } from "./stock-import.service.js";

/** An asset register of 100 000 homes is ~20 MB as CSV; generous headroom. */
const MAX_REGISTER_BYTES = 200 * 1024 * 1024;
/** File-system failures that mean "cannot store now", not "your upload is bad". */
const STORAGE_CODES = new Set(["ENOSPC", "EDQUOT", "EACCES", "EPERM", "EROFS", "ENOTDIR", "ENOENT", "EMFILE", "EIO"]);

/** multer for one "file" field into `incomingDir` (temporary, removed before the answer). */
function registerUpload(incomingDir: string): RequestHandler {
  mkdirSync(incomingDir, { recursive: true });
  const receive = multer({ dest: incomingDir, limits: { fileSize: MAX_REGISTER_BYTES, files: 1, fields: 5 } }).single("file");
  return (req, res, next) => {
    receive(req, res, (err?: unknown) => {
      if (!err) return next();
      const code = (err as { code?: unknown }).code;
      if (typeof code === "string" && STORAGE_CODES.has(code)) {
        req.log?.error({ err }, "a stock register upload could not be written to the incoming folder");
        return next(new ServiceUnavailableError("The file could not be stored just now. Please try again in a minute."));
      }
      next(err);
    });
  };
}

const noFile = () =>
  new ValidationError("file: choose the CSV or Excel export of your asset register.", [
    { field: "file", message: "Choose a CSV or .xlsx file." },
  ]);

/** Mounted at /api/stock-imports: admins only, their own landlord's imports only. */
export function createStockImportsRouter({ stock, incomingDir }: { stock: StockImportService; incomingDir: string }): Router {
  const router = Router();
  router.use(requireRole("admin"));
  const upload = registerUpload(incomingDir);

  router.get("/", async (req, res) => {
    const imports = await stock.list(actorOf(req));
    res.json(shaped(stockImportListResponse, { imports: imports.map(toStockImportDto) }));
  });

  router.post("/preview", upload, async (req, res) => {
    const file = req.file;
    if (!file) throw noFile();
    try {
      res.json(shaped(stockImportPreviewResponse, await stock.preview(file.path)));
    } finally {
      await rm(file.path, { force: true });
    }
  });

  router.post("/", upload, async (req, res) => {
    const file = req.file;
    try {
      if (!file) throw noFile();
      const fields = parse(stockImportFieldsSchema, req.body);
      const saved = await stock.import(actorOf(req), {
        filePath: file.path,
        fileName: file.originalname,
        mapping: fields.mapping,
      });
      res.status(201).json(shaped(stockImportResponse, toStockImportDto(saved)));
    } finally {
      if (file) await rm(file.path, { force: true });
    }
  });

  router.get("/:id", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    res.json(shaped(stockImportResponse, toStockImportDto(await stock.get(actorOf(req), id))));
  });

  router.get("/:id/report.csv", async (req, res) => {
    const { id } = parse(idParamsSchema, req.params, "params");
    const found = await stock.get(actorOf(req), id, true);
    res.type("text/csv").attachment(`stock-import-${id}-report.csv`).send(found.report);
  });

  return router;
}
