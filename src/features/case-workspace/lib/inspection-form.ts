// Checks the inspection form before it is sent. The ranges are those the server accepts
// (server/modules/inspections/inspections.schemas.ts and src/lib/schemas/psychrometrics.ts:
// air −20…50 °C, surfaces −30…50 °C, 0 < RH ≤ 100 %, moisture 0…100), with messages for people.
import type { Cause, InspectionInput, InspectionRoomReading, MoistureUnit, MouldExtent } from "../api/types";
import { londonLocalToIso } from "@/lib/dates";
import { parseDecimal, parseDecimalList } from "./numbers";

export interface RoomRowFields {
  /** Stable key for the row in the list. */
  key: string;
  roomId: string;
  airTemperatureC: string;
  relativeHumidityPct: string;
  surfaceTemperaturesC: string;
  moistureValue: string;
  moistureUnit: MoistureUnit;
  note: string;
}

export interface InspectionFields {
  /** datetime-local, London time. */
  inspectedAt: string;
  cause: Cause | "";
  mouldExtent: MouldExtent | "";
  findings: string;
  rooms: RoomRowFields[];
}

export type RoomRowErrors = Partial<Record<Exclude<keyof RoomRowFields, "key" | "moistureUnit">, string>>;

export interface InspectionErrors {
  inspectedAt?: string;
  cause?: string;
  mouldExtent?: string;
  findings?: string;
  /** By row key. */
  rooms: Record<string, RoomRowErrors>;
}

export const MAX_SURFACES_PER_ROOM = 20;
export const MAX_ROOM_ROWS = 30;

export const hasErrors = (e: InspectionErrors): boolean =>
  Boolean(e.inspectedAt || e.cause || e.mouldExtent || e.findings) ||
  Object.values(e.rooms).some((r) => Object.values(r).some(Boolean));

const inRange = (label: string, value: number | undefined, min: number, max: number, unit: string): string | undefined => {
  if (value === undefined) return undefined;
  if (Number.isNaN(value)) return `Enter the ${label} as a number, for example 18.5.`;
  if (value < min || value > max) return `The ${label} should be between ${min} and ${max} ${unit}. Please check the number.`;
  return undefined;
};

function checkRow(row: RoomRowFields, seen: Set<string>): { reading?: InspectionRoomReading; errors: RoomRowErrors } {
  const errors: RoomRowErrors = {};
  const roomId = Number(row.roomId);
  if (!row.roomId || !Number.isInteger(roomId) || roomId <= 0) errors.roomId = "Choose the room.";
  else if (seen.has(row.roomId)) errors.roomId = "This room already has a row: put all its readings in one row.";
  else seen.add(row.roomId);

  const air = parseDecimal(row.airTemperatureC);
  const airError = inRange("air temperature", air, -20, 50, "°C");
  if (airError) errors.airTemperatureC = airError;

  const rh = parseDecimal(row.relativeHumidityPct);
  if (rh !== undefined && Number.isNaN(rh))
    errors.relativeHumidityPct = "Enter the relative humidity as a number, for example 65.";
  else if (rh !== undefined && !(rh > 0 && rh <= 100))
    errors.relativeHumidityPct = "Relative humidity should be more than 0 and at most 100 %.";

  const surfaces = parseDecimalList(row.surfaceTemperaturesC);
  if (surfaces.some((s) => Number.isNaN(s)))
    errors.surfaceTemperaturesC = "Enter surface temperatures as numbers separated by spaces, for example 12.5 13.1.";
  else if (surfaces.some((s) => s < -30 || s > 50))
    errors.surfaceTemperaturesC = "Surface temperatures should be between −30 and 50 °C. Please check the numbers.";
  else if (surfaces.length > MAX_SURFACES_PER_ROOM)
    errors.surfaceTemperaturesC = `At most ${MAX_SURFACES_PER_ROOM} surface temperatures per room.`;

  const moisture = parseDecimal(row.moistureValue);
  if (moisture !== undefined && Number.isNaN(moisture))
    errors.moistureValue = "Enter the moisture meter reading as a number, for example 22.";
  else if (moisture !== undefined && (moisture < 0 || moisture > 100))
    errors.moistureValue = "The moisture meter reading should be between 0 and 100.";

  const note = row.note.trim();
  if (note.length > 1000) errors.note = "Keep the note under 1,000 characters.";

  if (air === undefined && rh === undefined && surfaces.length === 0 && moisture === undefined && !note && !errors.roomId) {
    errors.airTemperatureC = "Enter at least one reading or a note for this room, or remove the row.";
  }
  if (Object.values(errors).some(Boolean)) return { errors };

  const reading: InspectionRoomReading = { roomId };
  if (air !== undefined) reading.airTemperatureC = air;
  if (rh !== undefined) reading.relativeHumidityPct = rh;
  if (surfaces.length) reading.surfaceTemperaturesC = surfaces;
  if (moisture !== undefined) reading.moisture = { value: moisture, unit: row.moistureUnit };
  if (note) reading.note = note;
  return { reading, errors };
}

/** The request body, or the errors to show (nothing is sent while there are any). */
export function checkInspection(
  fields: InspectionFields,
  now = Date.now(),
): { input?: InspectionInput; errors: InspectionErrors } {
  const errors: InspectionErrors = { rooms: {} };
  const at = londonLocalToIso(fields.inspectedAt);
  if (!fields.inspectedAt.trim()) errors.inspectedAt = "Enter the date and time of the inspection.";
  else if (at === null)
    errors.inspectedAt = "Enter a date and time that exists in UK time (the clocks may have gone forward at that hour).";
  else if (Date.parse(at) > now + 60_000)
    errors.inspectedAt = "An inspection cannot be recorded in the future. Please check the date and time.";
  else if (new Date(at).getUTCFullYear() < 2000) errors.inspectedAt = "Please check the year of the inspection.";

  if (!fields.cause) errors.cause = "Choose the cause you found, or “Other or not yet known”.";
  if (!fields.mouldExtent) errors.mouldExtent = "Choose how much mould you saw.";
  const findings = fields.findings.trim();
  if (findings.length < 10) errors.findings = "Describe what you found in a sentence or two.";
  else if (findings.length > 8000) errors.findings = "Keep the findings under 8,000 characters.";

  const seen = new Set<string>();
  const readings: InspectionRoomReading[] = [];
  for (const row of fields.rooms) {
    const { reading, errors: rowErrors } = checkRow(row, seen);
    if (reading) readings.push(reading);
    else errors.rooms[row.key] = rowErrors;
  }

  if (hasErrors(errors)) return { errors };
  return {
    input: {
      inspectedAt: at!,
      cause: fields.cause as Cause,
      mouldExtent: fields.mouldExtent as MouldExtent,
      findings,
      roomReadings: readings,
    },
    errors,
  };
}
