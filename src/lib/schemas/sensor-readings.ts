// What a sensor (or a gateway for it) sends: one shape over HTTP and MQTT, checked the same way by
// the server's ingest. Each reading is checked on its own, so one bad value refuses only itself.
import { z } from "zod";

/** How late a reading may arrive and still be taken in (ours: a sensor or gateway offline for a month). */
export const SENSOR_LATE_LIMIT_DAYS = 30;
/** At most this many readings in one message (HTTP body or MQTT payload). */
export const SENSOR_BATCH_MAX = 5000;

/**
 * One reading as sent. Times are ISO 8601 with a zone (`2026-12-05T06:45:00Z`); stored to the whole
 * second. RH is relative to liquid water at every temperature (the WMO convention sensors follow).
 * Ranges are checked by the ingest, per reading, so that each refusal can carry its own reason.
 */
export const incomingSensorReading = z.object({
  takenAt: z.string(),
  airTemperatureC: z.number(),
  relativeHumidityPct: z.number(),
  surfaceTemperatureC: z.number().nullable().optional(),
  batteryPct: z.number().nullable().optional(),
});
export type IncomingSensorReading = z.infer<typeof incomingSensorReading>;

/**
 * The body of `POST /api/sensor-ingest/readings` (device key in `Authorization: Bearer …`) and the
 * payload on a device's MQTT topic. `serial`, when given, must be the device's own.
 */
export const sensorReadingBatch = z.object({
  serial: z.string().max(64).optional(),
  readings: z.array(z.unknown()).min(1).max(SENSOR_BATCH_MAX),
});
export type SensorReadingBatch = z.infer<typeof sensorReadingBatch>;

/**
 * The same readings as CSV (`Content-Type: text/csv`, for a gateway's or logger's backlog): a header
 * line naming these columns in any order (surface and battery may be left out), then one reading a
 * line; times as above, numbers plain decimals, an empty surface or battery field "not measured".
 */
export const SENSOR_CSV_COLUMNS = [
  "takenAt",
  "airTemperatureC",
  "relativeHumidityPct",
  "surfaceTemperatureC",
  "batteryPct",
] as const satisfies readonly (keyof IncomingSensorReading)[];
export const SENSOR_CSV_REQUIRED = ["takenAt", "airTemperatureC", "relativeHumidityPct"] as const;
/** At most this many readings in one CSV body: a logger's month at 1-minute intervals, with room to spare. */
export const SENSOR_CSV_BATCH_MAX = 50_000;
