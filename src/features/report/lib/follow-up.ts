// What still has to happen for a report that has just been created: photos and readings go up
// after the case exists, and a logger file waits for its columns to be checked. Held in memory
// (File objects cannot be stored), so the case page can show a failed part with a retry.
import { useSyncExternalStore } from "react";
import { errorMessage } from "@/lib/api-client";
import { addReadings } from "../api/add-readings";
import type { HandReading, ReadingsAdded } from "../api/types";
import { uploadPhotos } from "../api/upload-photos";
import { refusedFromError } from "./photo-files";

export type PartStatus = "sending" | "done" | "failed";

export interface FollowUp {
  caseId: number;
  photos?: {
    files: File[];
    status: PartStatus;
    error?: string;
    added?: number;
    /** Files the server could not take, each with its reason (the others were added). */
    refused?: { name: string; message: string }[];
  };
  readings?: { items: HandReading[]; status: PartStatus; error?: string; result?: ReadingsAdded };
  loggerFile?: { file: File; roomId: number | null; status: "waiting" | "done" };
}

const followUps = new Map<number, FollowUp>();
const listeners = new Set<() => void>();

function put(next: FollowUp) {
  followUps.set(next.caseId, next);
  for (const listener of listeners) listener();
}

function patch(caseId: number, change: (f: FollowUp) => FollowUp) {
  const current = followUps.get(caseId);
  if (current) put(change(current));
}

export function startFollowUp(followUp: FollowUp) {
  put(followUp);
}

export function getFollowUp(caseId: number): FollowUp | undefined {
  return followUps.get(caseId);
}

export function forgetFollowUp(caseId: number) {
  if (followUps.delete(caseId)) for (const listener of listeners) listener();
}

export function markLoggerFileDone(caseId: number) {
  patch(caseId, (f) => (f.loggerFile ? { ...f, loggerFile: { ...f.loggerFile, status: "done" } } : f));
}

export async function sendPhotos(caseId: number): Promise<boolean> {
  const part = followUps.get(caseId)?.photos;
  if (!part || part.files.length === 0) return true;
  patch(caseId, (f) => ({ ...f, photos: { ...part, status: "sending", error: undefined } }));
  try {
    const { photos, refused } = await uploadPhotos(caseId, part.files);
    patch(caseId, (f) => ({
      ...f,
      photos: {
        files: [],
        status: "done",
        added: photos.length,
        refused: refused.map((r) => ({ name: r.name, message: r.reason })),
      },
    }));
    return true;
  } catch (error) {
    const refused = refusedFromError(error);
    patch(caseId, (f) => ({
      ...f,
      photos: refused.length
        ? // None could be read: trying the same files again would not help, so they are dropped and their reasons shown.
          { files: [], status: "done", added: 0, refused }
        : { ...part, status: "failed", error: errorMessage(error) },
    }));
    return false;
  }
}

export async function sendReadings(caseId: number): Promise<boolean> {
  const part = followUps.get(caseId)?.readings;
  if (!part || part.items.length === 0) return true;
  patch(caseId, (f) => ({ ...f, readings: { ...part, status: "sending", error: undefined } }));
  try {
    const result = await addReadings(caseId, part.items);
    patch(caseId, (f) => ({ ...f, readings: { items: [], status: "done", result } }));
    return true;
  } catch (error) {
    patch(caseId, (f) => ({ ...f, readings: { ...part, status: "failed", error: errorMessage(error) } }));
    return false;
  }
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

export function useFollowUp(caseId: number): FollowUp | undefined {
  return useSyncExternalStore(
    subscribe,
    () => followUps.get(caseId),
    () => undefined,
  );
}
