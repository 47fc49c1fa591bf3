// The OpenAPI 3.1 document of the public risk-engine API. Request bodies come straight from the
// zod schemas the routes validate with, so the document cannot drift from the checks.
import { z } from "zod";
import { ELEMENT_IDS, MATERIAL_SENSITIVITIES, SURFACE_STATES } from "../../../src/lib/domain/index.js";
import { POINT_REASON_IDS } from "../../../src/lib/domain/point.js";
import { evaluatePointSchema, evaluateSeriesSchema, MAX_SERIES_READINGS } from "../../../src/lib/schemas/psychrometrics.js";

const num = (description: string) => ({ type: "number", description });
const error = {
  type: "object",
  required: ["error"],
  properties: {
    error: {
      type: "object",
      required: ["code", "message"],
      properties: { code: { type: "string" }, message: { type: "string" }, details: {} },
    },
  },
};
const errorResponse = (description: string) => ({
  description,
  content: { "application/json": { schema: { $ref: "#/components/schemas/Error" } } },
});

const pointResult = {
  type: "object",
  required: [
    "dewPointC",
    "frostPointC",
    "vapourPressurePa",
    "saturationVapourPressurePa",
    "absoluteHumidityGPerM3",
    "humidityRatio",
    "surface",
    "reasons",
    "reasonIds",
  ],
  properties: {
    dewPointC: num(
      "Dew point of the room air, °C, over liquid water at any temperature: relative humidity is read as relative to water below 0 °C too (WMO-No. 8 convention).",
    ),
    frostPointC: {
      type: ["number", "null"],
      description:
        "Frost point of the room air, °C (saturation over ice): given whenever the dew point is below 0 °C, null otherwise. A surface at or below it gathers frost.",
    },
    vapourPressurePa: num("Water vapour partial pressure of the room air, Pa: relative humidity × saturation over water."),
    saturationVapourPressurePa: num(
      "Saturation vapour pressure over liquid water at the air temperature, Pa (Hyland–Wexler, ASHRAE Handbook—Fundamentals 2017 eq. 6), below 0 °C too.",
    ),
    absoluteHumidityGPerM3: num("Water vapour per cubic metre of room air, g/m³."),
    humidityRatio: num("kg of water vapour per kg of dry air."),
    surface: {
      type: "object",
      required: ["temperatureC", "source", "relativeHumidityPct", "state"],
      properties: {
        temperatureC: num("Surface temperature used, °C."),
        source: {
          type: "string",
          enum: ["measured", "estimated", "air"],
          description: "measured; estimated from the element and outdoor temperature; or taken at air temperature.",
        },
        relativeHumidityPct: num(
          "Relative humidity at the surface, %: over ice when the surface is at or below 0.01 °C (ISO 13788), over water above; above 100 the surface is below the dew point (the frost point below 0 °C).",
        ),
        temperatureFactor: num("fRsi = (θsi − θe)/(θi − θe): measured, or the element's typical value when estimated."),
        state: { type: "string", enum: SURFACE_STATES },
      },
    },
    reasons: { type: "array", items: { type: "string" }, description: "The result in plain words, with numbers." },
    reasonIds: {
      type: "array",
      description: "The same reasons by id, with their figures (numbers) and word ids (strings), for translation.",
      items: {
        type: "object",
        required: ["id", "values"],
        properties: {
          id: { type: "string", enum: POINT_REASON_IDS },
          values: { type: "object", additionalProperties: { oneOf: [{ type: "number" }, { type: "string" }] } },
        },
      },
    },
  },
};

const seriesResult = {
  type: "object",
  required: [
    "count",
    "from",
    "to",
    "hoursSurfaceRhAtLeast80",
    "hoursCondensing",
    "worstRolling30DayMeanSurfaceRhPct",
    "mouldIndex",
    "gaps",
    "diagnosis",
  ],
  properties: {
    count: { type: "integer" },
    from: { type: ["string", "null"], format: "date-time" },
    to: { type: ["string", "null"], format: "date-time" },
    hoursSurfaceRhAtLeast80: num("Hours with surface RH ≥ 80 % (ISO 13788 mould criterion)."),
    hoursCondensing: num("Hours with surface RH ≥ 100 % (over ice for a surface below 0 °C, ISO 13788: frost)."),
    worstRolling30DayMeanSurfaceRhPct: {
      type: ["number", "null"],
      description: "Worst 30-day rolling mean surface RH, % (ISO 13788 monthly criterion).",
    },
    mouldIndex: {
      type: "object",
      required: ["final", "max", "material"],
      properties: {
        final: num("VTT mould index at the last reading (0–6)."),
        max: num("Highest VTT mould index reached."),
        material: { type: "string", enum: MATERIAL_SENSITIVITIES },
      },
    },
    gaps: {
      type: "array",
      description: "Intervals longer than 3 hours between readings, not integrated across.",
      items: {
        type: "object",
        required: ["from", "to"],
        properties: { from: { type: "string", format: "date-time" }, to: { type: "string", format: "date-time" } },
      },
    },
    moistureExcess: {
      type: "object",
      description: "Present when readings carry an outdoor temperature.",
      required: ["meanGPerM3", "loadClass"],
      properties: {
        meanGPerM3: num("Mean internal moisture excess, g/m³."),
        loadClass: { type: "integer", minimum: 1, maximum: 5, description: "ISO 13788 internal moisture load class." },
      },
    },
    diagnosis: {
      type: "object",
      required: ["kind", "reasons"],
      properties: {
        kind: {
          type: "string",
          enum: ["ventilation-or-moisture-load", "cold-surface", "likely-not-condensation", "no-risk-found", "insufficient-data"],
        },
        reasons: { type: "array", items: { type: "string" } },
      },
    },
  },
};

export function openApiDocument(serverUrl: string) {
  return {
    openapi: "3.1.0",
    info: {
      title: "Dewline risk engine",
      version: "1.0.0",
      description:
        "Dew point, surface humidity, condensation and mould-growth risk from room readings. Public: no sign-in, no CSRF token. /evaluate is limited to 120 requests a minute per address; /series to a budget of readings a minute per address (200 000 by default), with at most 10 000 readings per request without signing in. Elements: " +
        ELEMENT_IDS.join(", ") +
        ".",
    },
    servers: [{ url: serverUrl }],
    paths: {
      "/api/psychrometrics/evaluate": {
        post: {
          summary: "Evaluate one reading",
          requestBody: { required: true, content: { "application/json": { schema: z.toJSONSchema(evaluatePointSchema) } } },
          responses: {
            "200": { description: "The evaluation.", content: { "application/json": { schema: pointResult } } },
            "400": errorResponse("A field is missing, not a number, or outside its physical range; the message names the field."),
            "429": errorResponse("Too many requests from this address."),
          },
        },
      },
      "/api/psychrometrics/series": {
        post: {
          summary: "Evaluate a time series of readings",
          description: `Up to ${MAX_SERIES_READINGS} readings per request when signed in (the session cookie of the app), 10 000 by default otherwise. Each reading counts against the address's budget of readings a minute.`,
          requestBody: { required: true, content: { "application/json": { schema: z.toJSONSchema(evaluateSeriesSchema) } } },
          responses: {
            "200": { description: "The series evaluation.", content: { "application/json": { schema: seriesResult } } },
            "400": errorResponse("Invalid readings; the message names the field, e.g. readings.3.relativeHumidityPct."),
            "413": errorResponse(`More readings than the caller's limit (${MAX_SERIES_READINGS} signed in).`),
            "429": errorResponse("This address has used its budget of readings for the minute; see Retry-After."),
          },
        },
      },
    },
    components: { schemas: { Error: error } },
  };
}
