import { z } from "zod";
import { id, instant } from "./common.js";
import { pointResult, seriesResult } from "./psychrometrics.js";

export const surfaceEvaluation = z.object({ element: z.string(), label: z.string(), result: pointResult });

export const roomEvaluation = z.object({
  roomId: id,
  roomName: z.string(),
  readingsCount: z.number().int(),
  latest: z
    .object({
      takenAt: instant,
      airTemperatureC: z.number(),
      relativeHumidityPct: z.number(),
      surfaceTemperatureC: z.number().nullable(),
      outdoorTemperatureC: z.number().nullable(),
    })
    .nullable(),
  surfaces: z.array(surfaceEvaluation),
  series: seriesResult.nullable(),
  /** True while newer readings are being taken in: the figures are the last stored ones, soon replaced. */
  updating: z.boolean().optional(),
  /** When these figures were worked out. */
  evaluatedAt: instant.nullable().optional(),
  /** Staff only: where the outdoor values behind the estimates came from (the weather service, for readings without). */
  outdoor: z
    .object({
      fromWeather: z.number().int(),
      place: z.enum(["home", "estate"]).nullable(),
      note: z.string(),
    })
    .nullable()
    .optional(),
});
export type RoomEvaluationResponse = z.infer<typeof roomEvaluation>;

/** GET /api/cases/:id/evaluation. */
export const evaluationResponse = z.object({
  /** The server's sentence that the landlord investigates whatever the readings say. */
  statement: z.string(),
  /** True when any room's figures are being brought up to date with the newest readings. */
  updating: z.boolean().optional(),
  rooms: z.array(roomEvaluation),
});
export type EvaluationResponse = z.infer<typeof evaluationResponse>;
