// Sensors: the registry's replies, the once-shown credentials, the ingest's outcome and a sensor's series.
import { z } from "zod";
import { SENSOR_STATES } from "../schemas/sensors.js";
import { calendarDate, id, instant, pageOf } from "./common.js";

export const sensorResponse = z.object({
  id,
  propertyId: id,
  roomId: id,
  /** The home's first address line and the room's name, for lists. */
  homeAddress: z.string(),
  roomName: z.string(),
  serial: z.string(),
  model: z.string(),
  placement: z.string(),
  measuresSurface: z.boolean(),
  intervalS: z.number().int().positive(),
  installedOn: calendarDate,
  removedOn: calendarDate.nullable(),
  state: z.enum(SENSOR_STATES),
  mqttUsername: z.string(),
  mqttTopic: z.string(),
  keyIssuedAt: instant.nullable(),
  revokedAt: instant.nullable(),
  lastReadingAt: instant.nullable(),
  version: z.number().int().positive(),
});
export type SensorResponse = z.infer<typeof sensorResponse>;

export const sensorPageResponse = pageOf(sensorResponse);
export const sensorListResponse = z.object({ items: z.array(sensorResponse) });

/** Register and issue/rotate: the secret appears here once and is never shown again. */
export const sensorCredentialsResponse = z.object({
  sensor: sensorResponse,
  credentials: z.object({
    secret: z.string(),
    mqttUsername: z.string(),
    mqttTopic: z.string(),
    /** The HTTP ingest's path (POST, `Authorization: Bearer <secret>`). */
    httpPath: z.string(),
  }),
});
export type SensorCredentialsResponse = z.infer<typeof sensorCredentialsResponse>;

/** POST /api/sensor-ingest/readings: what became of each reading. */
export const sensorIngestResponse = z.object({
  stored: z.number().int().min(0),
  duplicates: z.number().int().min(0),
  refused: z.array(z.object({ index: z.number().int().min(0), takenAt: z.string().nullable(), reason: z.string() })),
});
export type SensorIngestResponse = z.infer<typeof sensorIngestResponse>;

/** GET /api/sensors/:id/readings: a bounded window, averaged into buckets when long. */
export const sensorReadingsResponse = z.object({
  sensorId: id,
  from: instant,
  to: instant,
  /** 0 when every reading is given as stored; else the bucket length averaged over. */
  bucketS: z.number().int().min(0),
  points: z.array(
    z.object({
      takenAt: instant,
      airTemperatureC: z.number(),
      relativeHumidityPct: z.number(),
      surfaceTemperatureC: z.number().nullable(),
      batteryPct: z.number().nullable(),
    }),
  ),
});
export type SensorReadingsResponse = z.infer<typeof sensorReadingsResponse>;
