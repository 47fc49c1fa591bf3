// The parts of the server's answers that the report feature reads.

/** What POST /api/cases answers (the whole case; the form needs only these). */
export interface CreatedCase {
  id: number;
  reference: string | null;
  status: string;
  createdAt: string;
}

export interface UploadedPhoto {
  id: number;
  url: string;
  thumbnailUrl: string;
  width: number;
  height: number;
  sha256: string;
  createdAt: string;
}

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

export interface ReadingsAdded {
  imported: number;
  duplicates: number;
  rejected: number;
}

/** A column is named by its header or by its position, as the server proposed it. */
export type ColumnRef = string | number;

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

export interface ImportPreview {
  delimiter: string;
  hasHeader: boolean;
  headers: string[];
  mapping: ImportMapping;
  sampleRows: string[][];
  problems: string[];
}

export interface ImportResult {
  importId: number;
  imported: number;
  duplicates: number;
  rejected: number;
  rejectedReportUrl?: string;
}

/** A room of the home, as the pages hand it to the report's components. */
export interface RoomOption {
  id: number;
  name: string;
}
