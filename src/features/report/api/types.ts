// The server's answers the report feature reads (inferred from the API contract, src/lib/contracts)
// and the requests it sends.
import type {
  CaseResponse,
  ImportPreviewResponse,
  ImportResultResponse,
  PhotoResponse,
  ReadingsAdded as ContractReadingsAdded,
} from "@/lib/contracts";

/** What POST /api/cases answers (the whole case; the form needs only these). */
export type CreatedCase = Pick<CaseResponse, "id" | "reference" | "status" | "createdAt">;

export type UploadedPhoto = PhotoResponse;

/** One reading typed in by hand, as POST /api/cases/:id/readings takes it. */
export interface HandReading {
  roomId: number;
  /** ISO 8601 with Z. */
  takenAt: string;
  airTemperatureC: number;
  relativeHumidityPct: number;
  surfaceTemperatureC?: number;
  outdoorTemperatureC?: number;
}

export type ReadingsAdded = ContractReadingsAdded;

/** A column is named by its header or by its position, as the server proposed it. */
export type ColumnRef = string | number;

/** The mapping sent back with POST /api/cases/:id/readings/import (the user may change the proposal). */
export interface ImportMapping {
  timestamp: ColumnRef;
  temperature: ColumnRef;
  humidity: ColumnRef;
  surfaceTemperature?: ColumnRef | null;
  outdoorTemperature?: ColumnRef | null;
  temperatureUnit: "C" | "F";
  dateFormat: string;
  timeZone: string;
}

export type ImportPreview = ImportPreviewResponse;
export type ImportResult = ImportResultResponse;

/** A room of the home, as the pages hand it to the report's components. */
export interface RoomOption {
  id: number;
  name: string;
}
