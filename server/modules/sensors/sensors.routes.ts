import express, { Router, type Request, type RequestHandler } from "express";
import {
  sensorCredentialsResponse,
  sensorIngestResponse,
  sensorListResponse,
  sensorPageResponse,
  sensorReadingsResponse,
  sensorResponse,
} from "../../../src/lib/contracts/sensors.js";
import { sensorReadingBatch } from "../../../src/lib/schemas/sensor-readings.js";
import { sensorCreateSchema, sensorPatchSchema, sensorRemoveSchema } from "../../../src/lib/schemas/sensors.js";
import { shaped } from "../../lib/contract.js";
import type { Clock } from "../../lib/clock.js";
import { ForbiddenError, UnauthorizedError, UnsupportedMediaTypeError, ValidationError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import { actorOf, requireRole, requireStaff } from "../../middleware/auth.js";
import type { SensorIdentity } from "./sensor-events.js";
import type { SensorIngestService } from "./sensor-ingest.service.js";
import { EMPTY as EMPTY_CSV } from "./readings-csv.js";
import { toSensorCredentialsDto, toSensorDto } from "./sensor.mapper.js";
import type { SensorService } from "./sensor.service.js";
import { homeParamsSchema, sensorListQuerySchema, sensorParamsSchema, sensorSeriesQuerySchema } from "./sensors.schemas.js";

const DAY_MS = 86_400_000;
/** SENSOR_BATCH_MAX readings of ~200 bytes each, with room for whitespace. */
export const SENSOR_INGEST_BODY_LIMIT = "4mb";
/** SENSOR_CSV_BATCH_MAX CSV lines of ~45 bytes each (up to ~80 with offsets and long decimals). */
const SENSOR_CSV_BODY_LIMIT = "4mb";
const lead = requireRole("admin", "maintenance");

/**
 * `/api/sensor-ingest`: devices (or their gateway) post readings with their own secret as a Bearer token.
 * Mounted before sessions and CSRF: no cookie is read, no token asked for.
 */
export function createSensorIngestRouter({ ingest }: { ingest: SensorIngestService }): Router {
  const router = Router();
  const devices = new WeakMap<Request, SensorIdentity>();
  // The key first, so an unknown caller never gets a multi-megabyte body parsed.
  const authenticate: RequestHandler = async (req, _res, next) => {
    const match = /^Bearer (\S+)$/.exec(req.get("authorization") ?? "");
    if (!match) throw new UnauthorizedError("Send the sensor's secret as `Authorization: Bearer dws_…`.");
    const sensor = await ingest.identifyByKey(match[1]!);
    if (!sensor) throw new UnauthorizedError("This sensor key is not valid: it is unknown, revoked, or the sensor was removed.");
    devices.set(req, sensor);
    next();
  };
  // JSON (`sensorReadingBatch`) or CSV (`SENSOR_CSV_COLUMNS`, the backlog form: read from the raw bytes).
  const bodies = [
    express.json({ limit: SENSOR_INGEST_BODY_LIMIT }),
    express.raw({ type: "text/csv", limit: SENSOR_CSV_BODY_LIMIT }),
  ];
  router.post("/readings", authenticate, ...bodies, async (req, res) => {
    const sensor = devices.get(req);
    if (!sensor) throw new UnauthorizedError();
    let outcome;
    if (Buffer.isBuffer(req.body)) {
      outcome = await ingest.ingestCsv(sensor, req.body);
    } else if (req.is("application/json")) {
      const batch = parse(sensorReadingBatch, req.body);
      if (batch.serial !== undefined && batch.serial !== sensor.serial) {
        throw new ForbiddenError("This key belongs to another sensor: a sensor can only send its own readings.", "wrong_sensor");
      }
      outcome = await ingest.ingest(sensor, batch.readings, "http");
    } else if (req.is("text/csv")) {
      throw new ValidationError(EMPTY_CSV);
    } else {
      throw new UnsupportedMediaTypeError("Send the readings as JSON (application/json) or as CSV (text/csv).");
    }
    res.json(shaped(sensorIngestResponse, outcome));
  });
  return router;
}

/** `/api/sensors`: the landlord's sensors (staff read; admin and maintenance leads change). */
export function createSensorsRouter({ sensors, clock }: { sensors: SensorService; clock: Clock }): Router {
  const router = Router();
  router.use(requireStaff);

  router.get("/", async (req, res) => {
    const query = parse(sensorListQuerySchema, req.query, "query");
    const { items, total } = await sensors.list(actorOf(req), query);
    res.json(shaped(sensorPageResponse, { items: items.map(toSensorDto), total, page: query.page, pageSize: query.pageSize }));
  });

  router.post("/", lead, async (req, res) => {
    const input = parse(sensorCreateSchema, req.body);
    const { view, secret } = await sensors.register(actorOf(req), input);
    res
      .status(201)
      .set("Cache-Control", "no-store")
      .json(shaped(sensorCredentialsResponse, toSensorCredentialsDto(view, secret)));
  });

  router.get("/:id", async (req, res) => {
    const { id } = parse(sensorParamsSchema, req.params, "params");
    res.json(shaped(sensorResponse, toSensorDto(await sensors.get(actorOf(req), id))));
  });

  router.patch("/:id", lead, async (req, res) => {
    const { id } = parse(sensorParamsSchema, req.params, "params");
    await sensors.get(actorOf(req), id); // another landlord's sensor is a 404 whatever the body
    const patch = parse(sensorPatchSchema, req.body);
    res.json(shaped(sensorResponse, toSensorDto(await sensors.update(actorOf(req), id, patch))));
  });

  router.post("/:id/credentials", lead, async (req, res) => {
    const { id } = parse(sensorParamsSchema, req.params, "params");
    const { view, secret } = await sensors.issue(actorOf(req), id);
    res.set("Cache-Control", "no-store").json(shaped(sensorCredentialsResponse, toSensorCredentialsDto(view, secret)));
  });

  router.post("/:id/revoke", lead, async (req, res) => {
    const { id } = parse(sensorParamsSchema, req.params, "params");
    res.json(shaped(sensorResponse, toSensorDto(await sensors.revoke(actorOf(req), id))));
  });

  router.post("/:id/remove", lead, async (req, res) => {
    const { id } = parse(sensorParamsSchema, req.params, "params");
    await sensors.get(actorOf(req), id); // another landlord's sensor is a 404 whatever the body
    const input = parse(sensorRemoveSchema, req.body);
    res.json(shaped(sensorResponse, toSensorDto(await sensors.remove(actorOf(req), id, input))));
  });

  router.get("/:id/readings", async (req, res) => {
    const { id } = parse(sensorParamsSchema, req.params, "params");
    const query = parse(sensorSeriesQuerySchema, req.query, "query");
    const to = query.to ? new Date(query.to) : clock.now();
    const from = query.from ? new Date(query.from) : new Date(to.getTime() - DAY_MS);
    const { bucketS, points } = await sensors.series(actorOf(req), id, from, to);
    res.json(
      shaped(sensorReadingsResponse, {
        sensorId: id,
        from: from.toISOString(),
        to: to.toISOString(),
        bucketS,
        points: points.map((p) => ({ ...p, takenAt: p.takenAt.toISOString() })),
      }),
    );
  });

  return router;
}

/** `/api/properties/:id/sensors`: the sensors fitted in one home (staff of its landlord). */
export function createHomeSensorsRouter({ sensors }: { sensors: SensorService }): Router {
  const router = Router();
  router.get("/:id/sensors", requireStaff, async (req, res) => {
    const { id } = parse(homeParamsSchema, req.params, "params");
    const items = await sensors.listForHome(actorOf(req), id);
    res.json(shaped(sensorListResponse, { items: items.map(toSensorDto) }));
  });
  return router;
}
