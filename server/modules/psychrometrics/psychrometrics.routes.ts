import express, { Router } from "express";
import { evaluatePoint, evaluateSeries, type MaterialSensitivity } from "../../../src/lib/domain/index.js";
import { evaluatePointSchema, evaluateSeriesSchema, MAX_SERIES_READINGS } from "../../../src/lib/schemas/psychrometrics.js";
import { PayloadTooLargeError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import { limiter } from "../../middleware/rate-limit.js";

/**
 * The public risk-engine API: no sign-in, no session and no CSRF token (it computes and stores
 * nothing), limited per IP.
 */
export function createPsychrometricsRouter(): Router {
  const router = Router();
  router.use(limiter({ windowMs: 60_000, limit: 120, message: "Too many calculations from this address." }));
  // A year of readings at 5-minute intervals is about 10 MB of JSON; the reading count is checked below.
  router.use(express.json({ limit: "20mb" }));

  router.post("/evaluate", (req, res) => {
    const input = parse(evaluatePointSchema, req.body);
    res.json(evaluatePoint(input));
  });

  router.post("/series", (req, res) => {
    const readings = (req.body as { readings?: unknown } | undefined)?.readings;
    if (Array.isArray(readings) && readings.length > MAX_SERIES_READINGS) {
      throw new PayloadTooLargeError(
        `readings can hold at most ${MAX_SERIES_READINGS.toLocaleString("en-GB")} readings per request; this one has ${readings.length.toLocaleString("en-GB")}.`,
      );
    }
    const input = parse(evaluateSeriesSchema, req.body);
    res.json(evaluateSeries({ ...input, material: input.material as MaterialSensitivity | undefined }));
  });

  return router;
}
