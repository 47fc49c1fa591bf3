// The three-day condensation outlook of a home (GET /api/me/outlook for its tenant,
// GET /api/properties/:id/outlook for its landlord's staff).
import { z } from "zod";
import { ROOM_KINDS } from "../homes.js";
import { ELEMENT_IDS } from "../domain/surface.js";
import { ADVICE_BASES, OUTLOOK_LEVELS, type AdviceBasisId } from "../domain/condensation-outlook.js";
import { calendarDate, id, instant } from "./common.js";

const ADVICE_BASIS_IDS = Object.keys(ADVICE_BASES) as [AdviceBasisId, ...AdviceBasisId[]];

export const INDOOR_SOURCES = ["sensor", "case-readings", "assumed"] as const;

/**
 * A tip, caution or method line: `text` in English; a tenant screen says it by `id` (home namespace,
 * outlook.advice / outlook.methodLines) with `values` as ICU arguments, falling back to `text`.
 */
const line = z.object({ id: z.string(), text: z.string(), values: z.record(z.string(), z.number()) });
export type OutlookLineResponse = z.infer<typeof line>;
const advice = line.extend({ basis: z.string(), basisId: z.enum(ADVICE_BASIS_IDS) });
export type OutlookAdviceResponse = z.infer<typeof advice>;

export const outlookDayResponse = z.object({
  date: calendarDate,
  hours: z.number().int().min(0),
  hoursAtOrAbove80: z.number().int().min(0),
  condensingHours: z.number().int().min(0),
  coldestSurfaceTemperatureC: z.number().nullable(),
  /** The raw ratio (above 100: condensing). */
  highestSurfaceRelativeHumidityPct: z.number().nullable(),
  lowestOutdoorTemperatureC: z.number().nullable(),
  level: z.enum(OUTLOOK_LEVELS).nullable(),
});
export type OutlookDayResponse = z.infer<typeof outlookDayResponse>;

export const outlookRoomResponse = z.object({
  roomId: id,
  name: z.string(),
  kind: z.enum(ROOM_KINDS),
  indoor: z.object({
    airTemperatureC: z.number(),
    relativeHumidityPct: z.number(),
    source: z.enum(INDOOR_SOURCES),
    takenAt: instant.nullable(),
  }),
  days: z.array(outlookDayResponse),
  hours: z.array(
    z.object({
      at: instant,
      outdoorTemperatureC: z.number(),
      surfaceTemperatureC: z.number(),
      surfaceRelativeHumidityPct: z.number(),
    }),
  ),
});
export type OutlookRoomResponse = z.infer<typeof outlookRoomResponse>;

export const outlookResponse = z.object({
  propertyId: id,
  generatedAt: instant,
  timeZone: z.string(),
  /** The London dates covered: today and the two after it. */
  dates: z.array(calendarDate),
  /** False when the home has no location on record or no forecast could be had: no levels then. */
  forecastAvailable: z.boolean(),
  surface: z.object({ elementId: z.enum(ELEMENT_IDS), label: z.string(), fRsi: z.number(), basis: z.string() }),
  rooms: z.array(outlookRoomResponse),
  tips: z.array(advice),
  cautions: z.array(advice),
  /** How the figures were worked out, in plain words (the method and our assumptions). */
  method: z.array(line),
});
export type OutlookResponse = z.infer<typeof outlookResponse>;
