// A home and its rooms as an admin adds or edits them: the schema the server validates with and the
// admin's forms check with. Labels for people live in src/lib/homes.ts.
import { z } from "zod";
import { isUkPostcode, normalisePostcode } from "../domain/postcode.js";
import { latitudeSchema, longitudeSchema } from "./locations.js";
import { BUILT_FORMS, GLAZING_TYPES, HEATING_TYPES, ROOM_KINDS, VENTILATION_TYPES, WALL_TYPES } from "../homes.js";

export { normalisePostcode } from "../domain/postcode.js";

export const postcodeSchema = z
  .string({ error: "Enter the postcode." })
  .trim()
  .min(1, "Enter the postcode.")
  .refine(isUkPostcode, "Enter a UK postcode, like AB1 2CD.")
  .transform(normalisePostcode);

/** Empty text is no answer (null). */
const optionalText = (max: number, what: string) =>
  z
    .string()
    .trim()
    .max(max, `${what} can be at most ${max} characters.`)
    .nullish()
    .transform((v) => (v ? v : null));

const requiredText = (max: number, missing: string, what: string) =>
  z.string({ error: missing }).trim().min(1, missing).max(max, `${what} can be at most ${max} characters.`);

export const uprnSchema = z
  .string()
  .trim()
  .regex(/^\d{0,12}$/, "A UPRN is a number of up to 12 digits.")
  .nullish()
  .transform((v) => (v ? v : null));

export const roomSchema = z.object({
  name: requiredText(100, "Give the room a name.", "The room's name"),
  kind: z.enum(ROOM_KINDS, { error: `kind must be one of ${ROOM_KINDS.join(", ")}.` }),
});
export type RoomInput = z.infer<typeof roomSchema>;

export const roomPatchSchema = roomSchema
  .partial()
  .refine((v) => v.name !== undefined || v.kind !== undefined, "Change the name or the kind of room.");
export type RoomPatch = z.infer<typeof roomPatchSchema>;

const homeFields = {
  addressLine1: requiredText(190, "Enter the first line of the address.", "The first line"),
  addressLine2: optionalText(190, "The second line"),
  town: requiredText(100, "Enter the town.", "The town"),
  postcode: postcodeSchema,
  uprn: uprnSchema,
  estate: requiredText(100, "Enter the estate (or the street, for a home on no estate).", "The estate"),
  block: optionalText(100, "The block"),
  builtForm: z.enum(BUILT_FORMS, { error: "Choose the type of home." }),
  wallType: z.enum(WALL_TYPES, { error: "Choose the walls." }),
  glazingType: z.enum(GLAZING_TYPES, { error: "Choose the glazing." }),
  heatingType: z.enum(HEATING_TYPES, { error: "Choose the heating." }),
  ventilation: z.enum(VENTILATION_TYPES, { error: "Choose the ventilation." }),
  // Where the home is, for its outdoor weather (null or absent: its estate's location is used).
  latitude: latitudeSchema.nullish().transform((v) => v ?? null),
  longitude: longitudeSchema.nullish().transform((v) => v ?? null),
};

/** POST /api/properties: a new home, with its rooms if known. */
export const homeSchema = z.object({
  ...homeFields,
  ventilation: homeFields.ventilation.default("not-recorded"),
  rooms: z.array(roomSchema).max(30, "A home can have at most 30 rooms here.").default([]),
});
export type HomeInput = z.infer<typeof homeSchema>;

/** PATCH /api/properties/:id: only the fields sent change. */
export const homePatchSchema = z
  .object(homeFields)
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, "Send at least one field to change.");
export type HomePatch = z.infer<typeof homePatchSchema>;
