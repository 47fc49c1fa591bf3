// Coordinates of homes and estates (WGS84 degrees), for their outdoor weather.
import { z } from "zod";

export const latitudeSchema = z
  .number({ error: "latitude must be a number of degrees." })
  .min(49, "latitude must be in the UK: 49 to 61 degrees north.")
  .max(61, "latitude must be in the UK: 49 to 61 degrees north.");

export const longitudeSchema = z
  .number({ error: "longitude must be a number of degrees." })
  .min(-9, "longitude must be in the UK: 9 degrees west to 2 degrees east.")
  .max(2, "longitude must be in the UK: 9 degrees west to 2 degrees east.");

/** PUT /api/estate-locations: where one of the landlord's estates is. */
export const estateLocationSchema = z.object({
  estate: z.string({ error: "Choose the estate." }).trim().min(1, "Choose the estate.").max(100),
  latitude: latitudeSchema,
  longitude: longitudeSchema,
});
export type EstateLocationInput = z.infer<typeof estateLocationSchema>;
