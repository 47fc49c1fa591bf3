import { z } from "zod";
import { SENSOR_STATES } from "../../../src/lib/schemas/sensors.js";
import { idParam } from "../../lib/validation.js";

export const sensorParamsSchema = z.object({ id: idParam("The sensor id") });
export const homeParamsSchema = z.object({ id: idParam("The home id") });

export const sensorListQuerySchema = z.object({
  propertyId: idParam("The home id").optional(),
  state: z.enum(SENSOR_STATES, { error: `state is one of ${SENSOR_STATES.join(", ")}.` }).optional(),
  page: z.coerce.number({ error: "page must be a number." }).int().min(1, "page starts at 1.").default(1),
  pageSize: z.coerce
    .number({ error: "pageSize must be a number." })
    .int()
    .min(1)
    .max(200, "pageSize can be at most 200.")
    .default(25),
});

/** GET /api/sensors/:id/readings: an ISO window (default: the last 24 hours to now). */
export const sensorSeriesQuerySchema = z.object({
  from: z.iso.datetime({ offset: true, error: "from must be an ISO date and time with a zone." }).optional(),
  to: z.iso.datetime({ offset: true, error: "to must be an ISO date and time with a zone." }).optional(),
});
