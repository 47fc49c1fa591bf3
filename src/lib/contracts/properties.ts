import { z } from "zod";
import { BUILT_FORMS, GLAZING_TYPES, HEATING_TYPES, ROOM_KINDS, WALL_TYPES } from "../homes.js";
import { calendarDate, id, pageOf } from "./common.js";

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
