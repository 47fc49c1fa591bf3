// A sensor as a lead registers and edits it: the schemas the server validates with and the register
// form checks with.
import { z } from "zod";

/** Reporting interval bounds: one minute to one day. */
export const SENSOR_INTERVAL_MIN_S = 60;
export const SENSOR_INTERVAL_MAX_S = 86_400;
export const SENSOR_STATES = ["active", "revoked", "removed"] as const;
export type SensorState = (typeof SENSOR_STATES)[number];

const positiveId = (what: string) =>
  z
    .number({ error: `Choose ${what}.` })
    .int(`Choose ${what}.`)
    .positive(`Choose ${what}.`);
const isoDate = (what: string) => z.iso.date({ error: `${what} must be a date (YYYY-MM-DD).` });

const text = (what: string, max: number) =>
  z
    .string({ error: `Give the ${what}.` })
    .trim()
    .min(1, `Give the ${what}.`)
    .max(max, `The ${what} can be at most ${max} characters.`);

export const sensorFieldsSchema = z.object({
  propertyId: positiveId("the home"),
  roomId: positiveId("the room"),
  serial: text("serial number", 64),
  model: text("model", 100),
  placement: text("placement", 200),
  measuresSurface: z.boolean({ error: "Say whether it has a surface probe." }),
  intervalS: z
    .number({ error: "Give the reporting interval in seconds." })
    .int("The interval is a whole number of seconds.")
    .min(SENSOR_INTERVAL_MIN_S, "The interval is at least one minute.")
    .max(SENSOR_INTERVAL_MAX_S, "The interval is at most one day (86 400 s)."),
  installedOn: isoDate("The installation date"),
});

/** POST /api/sensors: a new sensor; its secret is issued at once and shown in the reply only. */
export const sensorCreateSchema = sensorFieldsSchema;
export type SensorCreateInput = z.infer<typeof sensorCreateSchema>;

/** PATCH /api/sensors/:id: any of the fields, with the version the editor saw (409 when stale). */
export const sensorPatchSchema = sensorFieldsSchema.partial().extend({
  version: z.number({ error: "version is required." }).int().positive(),
});
export type SensorPatchInput = z.infer<typeof sensorPatchSchema>;

/** POST /api/sensors/:id/remove: taken out of the home on that day (not in the future); its credentials stop working. */
export const sensorRemoveSchema = z.object({
  removedOn: isoDate("The removal date"),
  version: z.number({ error: "version is required." }).int().positive(),
});
export type SensorRemoveInput = z.infer<typeof sensorRemoveSchema>;
