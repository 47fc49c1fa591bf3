import { z } from "zod";
import { SENSOR_ALERT_RULES } from "../domain/sensor-alerts.js";

const instant = z.iso.datetime({ offset: true });

export const sensorAlertRule = z.enum(SENSOR_ALERT_RULES);
export const SURFACE_BASES = ["measured", "estimated", "air"] as const;

/** A room's live figures over the 7 days up to its latest reading. */
export const sensorRoomFiguresResponse = z.object({
  roomId: z.number().int(),
  roomName: z.string(),
  /** "measured": a probe on the surface; "estimated": the element's fRsi and the outdoor temperature; "air": neither, air RH only. */
  surfaceBasis: z.enum(SURFACE_BASES),
  hoursAt80: z.number(),
  hoursCondensing: z.number(),
  condensingDays: z.number().int(),
  mouldIndex: z.number(),
  /** The last 7 London days, oldest first (the small chart). */
  days: z.array(z.object({ date: z.string(), hoursAt80: z.number(), hoursCondensing: z.number() })),
  latestReadingAt: instant,
  latestAirTemperatureC: z.number(),
  latestRelativeHumidityPct: z.number(),
  latestSurfaceRelativeHumidityPct: z.number(),
  computedAt: instant,
});

export const sensorAlertResponse = z.object({
  id: z.number().int(),
  roomId: z.number().int(),
  rule: sensorAlertRule,
  /** The whole hour its rule first held, from the readings' times. */
  raisedAt: instant,
  figures: z.object({
    hoursAt80: z.number(),
    hoursCondensing: z.number(),
    condensingDays: z.number().int(),
    mouldIndex: z.number(),
  }),
});

/** One home at risk: open alerts and no open case. */
export const homeAtRiskResponse = z.object({
  propertyId: z.number().int(),
  address: z.string(),
  estate: z.string(),
  /** The alert the actions take (the home's newest); they act on all the home's open alerts. */
  alertId: z.number().int(),
  firstRaisedAt: instant,
  alerts: z.array(sensorAlertResponse),
  rooms: z.array(sensorRoomFiguresResponse),
});

/** GET /api/sensor-alerts */
export const homesAtRiskResponse = z.object({ items: z.array(homeAtRiskResponse) });
export type HomesAtRiskResponse = z.infer<typeof homesAtRiskResponse>;
export type HomeAtRiskResponse = z.infer<typeof homeAtRiskResponse>;

export const ALERT_SORTS = ["raisedAt", "mouldIndex", "hoursAt80", "address"] as const;
export type AlertSortKey = (typeof ALERT_SORTS)[number];

/** POST /api/sensor-alerts/:id/proactive-case */
export const proactiveCaseResponse = z.object({
  caseId: z.number().int(),
  reference: z.string(),
  /** false: another officer opened it first; this is that case. */
  created: z.boolean(),
});
export type ProactiveCaseResponse = z.infer<typeof proactiveCaseResponse>;

/** POST /api/sensor-alerts/:id/dismiss */
export const alertsDismissedResponse = z.object({ dismissed: z.number().int() });
