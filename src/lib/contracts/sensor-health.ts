// Sensor health replies: is each sensor working, and the lead's summary of a landlord's sensors.
import { z } from "zod";
import { SENSOR_PROBLEMS } from "../domain/sensor-health.js";
import { id, instant, pageOf } from "./common.js";

export { SENSOR_PROBLEMS };
export const sensorProblem = z.enum(SENSOR_PROBLEMS);
export type SensorProblemName = z.infer<typeof sensorProblem>;

/** One problem: since when it began, and why, in plain words with the figures and the rule. */
export const sensorHealthFinding = z.object({
  problem: sensorProblem,
  since: instant,
  reason: z.string(),
});
export type SensorHealthFindingResponse = z.infer<typeof sensorHealthFinding>;

/** GET /api/sensor-health/:id: one sensor's health, worked out from its readings at the moment asked. */
export const sensorHealthResponse = z.object({
  sensorId: id,
  serial: z.string(),
  intervalS: z.number().int().positive(),
  lastReadingAt: instant.nullable(),
  /** No problem found. */
  ok: z.boolean(),
  findings: z.array(sensorHealthFinding),
  checkedAt: instant,
});
export type SensorHealthResponse = z.infer<typeof sensorHealthResponse>;

/** GET /api/sensor-health/summary: the landlord's sensors in use (not revoked, not removed), counted by problem. */
export const sensorHealthSummaryResponse = z.object({
  total: z.number().int().min(0),
  ok: z.number().int().min(0),
  /** Sensors with at least one problem (one with two problems counts once here, and once under each). */
  needingAttention: z.number().int().min(0),
  counts: z.object({
    offline: z.number().int().min(0),
    "low-battery": z.number().int().min(0),
    "flat-lined": z.number().int().min(0),
    jumping: z.number().int().min(0),
  }),
  /** The oldest stored check among sensors with readings (null when none has been checked yet). */
  oldestCheckAt: instant.nullable(),
  at: instant,
});
export type SensorHealthSummaryResponse = z.infer<typeof sensorHealthSummaryResponse>;

/** One sensor needing attention, with where it is. */
export const sensorAttentionItem = z.object({
  sensor: z.object({ id, serial: z.string(), placement: z.string(), intervalS: z.number().int().positive() }),
  home: z.object({ id, addressLine1: z.string(), town: z.string(), postcode: z.string() }),
  room: z.object({ id, name: z.string() }),
  lastReadingAt: instant.nullable(),
  findings: z.array(sensorHealthFinding).min(1),
  /** When its readings were last checked for battery, flat-lining and jumps (offline is always current). */
  checkedAt: instant.nullable(),
});
export type SensorAttentionItem = z.infer<typeof sensorAttentionItem>;

/** GET /api/sensor-health/devices: the sensors needing attention, by home, paged (`?problem=&page=&pageSize=`). */
export const sensorAttentionPageResponse = pageOf(sensorAttentionItem);
export type SensorAttentionPage = z.infer<typeof sensorAttentionPageResponse>;
