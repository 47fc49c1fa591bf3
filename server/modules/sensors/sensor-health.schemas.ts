import { z } from "zod";
import { SENSOR_PROBLEMS } from "../../../src/lib/domain/sensor-health.js";

/** `GET /api/sensor-health/devices`: every sensor needing attention, or those with one problem. */
export const sensorAttentionQuerySchema = z.object({
  problem: z.enum(SENSOR_PROBLEMS).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200, "pageSize can be at most 200.").default(50),
});
export type SensorAttentionQuery = z.infer<typeof sensorAttentionQuerySchema>;
