// Sending a report is several requests: the case first, then its photos, then its readings.
// Once the case exists the report is safe; a later part that fails is kept for a retry.
import type { CaseReport } from "@/lib/schemas/case-report";
import { createCase } from "../api/create-case";
import type { CreatedCase, HandReading } from "../api/types";
import { sendPhotos, sendReadings, startFollowUp } from "./follow-up";

export type SendProgress = "case" | "photos" | "readings";

export interface SendInput {
  report: CaseReport;
  photos: File[];
  readings: HandReading[];
  loggerFile: { file: File; roomId: number | null } | null;
}

export interface SendOutcome {
  created: CreatedCase;
  /** True when every part went up (a logger file still waits for its columns to be checked). */
  complete: boolean;
}

/** Throws only when the case itself could not be created: then nothing was sent. */
export async function sendReport(input: SendInput, onProgress?: (step: SendProgress) => void): Promise<SendOutcome> {
  onProgress?.("case");
  const created = await createCase(input.report);
  startFollowUp({
    caseId: created.id,
    photos: input.photos.length ? { files: input.photos, status: "sending" } : undefined,
    readings: input.readings.length ? { items: input.readings, status: "sending" } : undefined,
    loggerFile: input.loggerFile ? { ...input.loggerFile, status: "waiting" } : undefined,
  });
  let complete = true;
  if (input.photos.length) {
    onProgress?.("photos");
    complete = (await sendPhotos(created.id)) && complete;
  }
  if (input.readings.length) {
    onProgress?.("readings");
    complete = (await sendReadings(created.id)) && complete;
  }
  return { created, complete };
}
