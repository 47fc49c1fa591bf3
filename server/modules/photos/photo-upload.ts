// Receiving photo uploads (multipart/form-data) for every route that takes them: case photos (also
// the tenant's message attachments) and work-order evidence. One place for where temporary files
// go, the limits, and what a malformed body is answered with.
import { mkdirSync } from "node:fs";
import type { RequestHandler } from "express";
import multer from "multer";
import { AppError } from "../../lib/errors.js";
import { PhotoStorageError } from "./photo-processing.js";
import { MAX_PHOTO_BYTES, MAX_PHOTOS_PER_UPLOAD } from "./photo.service.js";

/** File-system failures that mean "cannot store now", not "your upload is bad". */
const STORAGE_CODES = new Set(["ENOSPC", "EDQUOT", "EACCES", "EPERM", "EROFS", "ENOTDIR", "ENOENT", "EMFILE", "EIO"]);

// Control characters (NUL included) have no place in a file name; busboy refuses a raw NUL in a
// header itself, but an encoded one (filename*=UTF-8''a%00b) arrives decoded.
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f]/;

const badUpload = (reason: string, advice = "Please try again.") =>
  new AppError(400, "bad_upload", `The upload could not be read: ${reason} ${advice}`);

/** Busboy's words for a malformed body, in ours. */
function malformed(message: string): AppError {
  if (/part header/i.test(message)) return badUpload("a part of it has a malformed header.");
  if (/unexpected end/i.test(message)) return badUpload("it ended too early (it may have been cut off).");
  if (/boundary/i.test(message)) return badUpload("its multipart boundary is missing or wrong.");
  return badUpload("it is not a well-formed multipart/form-data body.");
}

/**
 * multer for the "photos" field (at most MAX_PHOTOS_PER_UPLOAD files of MAX_PHOTO_BYTES), writing
 * into `incomingDir`. A malformed body is 400 with its reason, a failed write 503; multer removes
 * the files of a failed request itself.
 */
export function photoUpload(incomingDir: string): RequestHandler {
  mkdirSync(incomingDir, { recursive: true });
  const receive = multer({
    storage: multer.diskStorage({ destination: incomingDir }),
    limits: { fileSize: MAX_PHOTO_BYTES, files: MAX_PHOTOS_PER_UPLOAD, fields: 20, parts: 40 },
    fileFilter: (_req, file, accept) => {
      if (CONTROL.test(file.originalname))
        accept(badUpload("a file name contains a control character (such as NUL).", "Rename the file and try again."));
      else accept(null, true);
    },
  }).array("photos", MAX_PHOTOS_PER_UPLOAD);

  return (req, res, next) => {
    receive(req, res, (err?: unknown) => {
      if (!err) return next();
      if (err instanceof AppError || (err as { name?: string }).name === "MulterError") return next(err);
      const code = (err as { code?: unknown }).code;
      if (typeof code === "string" && STORAGE_CODES.has(code)) {
        req.log?.error({ err }, "an upload could not be written to the incoming folder");
        return next(new PhotoStorageError(err));
      }
      next(malformed(err instanceof Error ? err.message : String(err)));
    });
  };
}
