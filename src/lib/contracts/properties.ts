import { z } from "zod";
import { BUILT_FORMS, GLAZING_TYPES, HEATING_TYPES, ROOM_KINDS, VENTILATION_TYPES, WALL_TYPES } from "../homes.js";
import { CASE_STATUSES, CHANNELS } from "../schemas/case-report.js";
import { EPC_BANDS, HEATING_FUELS, WALL_INSULATIONS } from "../domain/stock-register.js";
import { calendarDate, id, instant, pageOf } from "./common.js";

export const roomResponse = z.object({ id, name: z.string(), kind: z.enum(ROOM_KINDS) });
export type RoomResponse = z.infer<typeof roomResponse>;

/** A home in a list (GET /api/properties). */
export const propertySummaryResponse = z.object({
  id,
  addressLine1: z.string(),
  addressLine2: z.string().nullable(),
  town: z.string(),
  postcode: z.string(),
  uprn: z.string().nullable(),
  estate: z.string(),
  block: z.string().nullable(),
  builtForm: z.enum(BUILT_FORMS),
  wallType: z.enum(WALL_TYPES),
  glazingType: z.enum(GLAZING_TYPES),
  heatingType: z.enum(HEATING_TYPES),
  ventilation: z.enum(VENTILATION_TYPES),
  builtYear: z.number().int().nullable(),
  ageBand: z.string().nullable(),
  wallInsulation: z.enum(WALL_INSULATIONS).nullable(),
  roofInsulationMm: z.number().int().min(0).nullable(),
  heatingFuel: z.enum(HEATING_FUELS).nullable(),
  hasExtractFans: z.boolean().nullable(),
  hasTrickleVents: z.boolean().nullable(),
  floorAreaM2: z.number().nullable(),
  epcBand: z.enum(EPC_BANDS).nullable(),
  /** Where the home is (WGS84 degrees), for its outdoor weather; null: its estate's location is used. */
  latitude: z.number().nullable().optional(),
  longitude: z.number().nullable().optional(),
});
export type PropertySummaryResponse = z.infer<typeof propertySummaryResponse>;

/** A home with its rooms (GET /api/properties/:id, GET /api/me/home). */
export const propertyResponse = propertySummaryResponse.extend({ rooms: z.array(roomResponse) });
export type PropertyResponse = z.infer<typeof propertyResponse>;

export const propertyPageResponse = pageOf(propertySummaryResponse);
export const estatesResponse = z.object({ estates: z.array(z.string()) });

/** GET /api/me/home: the tenant's current tenancy and home. */
export const myHomeResponse = z.object({
  tenancy: z.object({ id, startDate: calendarDate, endDate: calendarDate.nullable() }),
  property: propertyResponse,
});
export type MyHomeResponse = z.infer<typeof myHomeResponse>;

/** GET /api/properties/:id/tenants: the people with a tenancy of the home, current ones first. */
export const homeTenantResponse = z.object({
  tenancyId: id,
  userId: id,
  name: z.string(),
  email: z.string(),
  startDate: calendarDate,
  endDate: calendarDate.nullable(),
  current: z.boolean(),
  /** The tenant's stored language ("en", "cy", …), null when not known: staff see it beside the name. */
  language: z.string().nullable(),
});
export type HomeTenantResponse = z.infer<typeof homeTenantResponse>;
export const homeTenantsResponse = z.object({ tenants: z.array(homeTenantResponse) });

/** GET /api/properties/:id/cases: the home's cases, open and closed, newest first. */
export const homeCaseResponse = z.object({
  id,
  reference: z.string().nullable(),
  status: z.enum(CASE_STATUSES),
  channel: z.enum(CHANNELS),
  awareAt: instant,
  description: z.string(),
  tenantName: z.string().nullable(),
});
export type HomeCaseResponse = z.infer<typeof homeCaseResponse>;
export const homeCasesResponse = z.object({ cases: z.array(homeCaseResponse) });

/** GET /api/properties/:id/readings: each room's latest readings across the home's cases. */
export const homeRoomReadingsResponse = z.object({
  room: roomResponse,
  /** Readings in all, over every case of the home. */
  count: z.number().int().min(0),
  latest: z.array(
    z.object({
      caseId: id,
      takenAt: instant,
      airTemperatureC: z.number(),
      relativeHumidityPct: z.number(),
      surfaceTemperatureC: z.number().nullable(),
    }),
  ),
});
export type HomeRoomReadingsResponse = z.infer<typeof homeRoomReadingsResponse>;
export const homeReadingsResponse = z.object({ rooms: z.array(homeRoomReadingsResponse) });
