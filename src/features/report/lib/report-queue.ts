// Reports kept on the phone until they are sent. A report goes into this queue (IndexedDB, through
// idb-keyval: it can hold the photos themselves, which localStorage cannot) before its first try, and
// leaves it only once the case, its photos and its readings are all with the server. Each part has
// its own Idempotency-Key, chosen once and stored with the report, so a try whose answer was lost
// (signal gone mid-send) is answered by the server with the first answer and never makes a second case.
import { del, get, set } from "idb-keyval";
import { ApiError, errorMessage, newIdempotencyKey } from "@/lib/api-client";
import type { CaseReport } from "@/lib/schemas/case-report";
import { addReadings } from "../api/add-readings";
import { createCase } from "../api/create-case";
import type { CreatedCase, HandReading } from "../api/types";
import { uploadPhotos } from "../api/upload-photos";
import { refusedFromError } from "./photo-files";

export interface QueuedReport {
  id: string;
  /** Whose report it is: only sent while the same person is signed in. */
  userId: number;
  queuedAt: string;
  report: CaseReport;
  photos: File[];
  readings: HandReading[];
  loggerFile: { file: File; roomId: number | null } | null;
  keys: { case: string; photos: string; readings: string };
  /** Set once the case exists: later tries send only what is left. */
  caseId?: number;
  photosDone?: boolean;
  readingsDone?: boolean;
  /** Photos the server could not read (kept out, with the reason, so the rest can go). */
  refusedPhotos?: { name: string; message: string }[];
  /** The server said no (4xx): kept, with its reason, until the tenant tries again or removes it. */
  /**
   * The server's answer when it refused a part. `step` says which part after the case was made (the
   * page says "sent, but not your photos" in the person's language); older copies carry it in `message`.
   */
  refusal?: {
    status: number;
    code: string;
    message: string;
    step?: "photos" | "readings";
    fields?: { field: string; message: string }[];
  };
}

/** Where the queue lives: IndexedDB in the browser, a plain object in the unit tests. */
export interface QueueStorage {
  read(): Promise<QueuedReport[]>;
  write(items: QueuedReport[]): Promise<void>;
}

const STORAGE_KEY = "dewline-report-queue";

export const indexedDbStorage: QueueStorage = {
  read: async () => (await get<QueuedReport[]>(STORAGE_KEY)) ?? [],
  write: (items) => (items.length ? set(STORAGE_KEY, items) : del(STORAGE_KEY)),
};

/** The requests that send a report (the real API; the unit tests pass their own). */
export interface ReportSender {
  createCase: typeof createCase;
  uploadPhotos: typeof uploadPhotos;
  addReadings: typeof addReadings;
}

const apiSender: ReportSender = { createCase, uploadPhotos, addReadings };

export type SendStep = "case" | "photos" | "readings";

export type SendResult =
  | { kind: "sent"; created: CreatedCase | null; report: QueuedReport }
  | { kind: "waiting"; report: QueuedReport }
  | { kind: "refused"; report: QueuedReport; error: ApiError };

// ---- The queue's state, shared by every page that shows it.
interface QueueState {
  loaded: boolean;
  items: QueuedReport[];
  /** Reports being sent right now (their ids). */
  sending: string[];
}

let storage: QueueStorage = indexedDbStorage;
let sender: ReportSender = apiSender;
let state: QueueState = { loaded: false, items: [], sending: [] };
const listeners = new Set<() => void>();
/** One write at a time, in order: two quick changes never overwrite each other. */
let writes: Promise<unknown> = Promise.resolve();

function setState(next: Partial<QueueState>) {
  state = { ...state, ...next };
  for (const listener of listeners) listener();
}

export function subscribeQueue(listener: () => void): () => void {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

export const getQueueState = (): QueueState => state;

/** For the unit tests: a storage and a sender of their own, and a fresh state. */
export function setQueueBackends(next: { storage?: QueueStorage; sender?: ReportSender }) {
  storage = next.storage ?? indexedDbStorage;
  sender = next.sender ?? apiSender;
  state = { loaded: false, items: [], sending: [] };
  writes = Promise.resolve();
}

/** Shown only once stored: a report the device could not keep is never shown as kept. */
function save(items: QueuedReport[]): Promise<void> {
  const write = writes.then(() => storage.write(items)).then(() => setState({ items }));
  writes = write.catch(() => undefined);
  return write;
}

function update(id: string, change: (r: QueuedReport) => QueuedReport): Promise<QueuedReport | undefined> {
  let updated: QueuedReport | undefined;
  const items = state.items.map((r) => (r.id === id ? (updated = change(r)) : r));
  return save(items).then(() => updated);
}

/** Reads what is kept on this device (once; later calls return the same state). */
export async function loadQueue(): Promise<QueuedReport[]> {
  if (state.loaded) return state.items;
  let items: QueuedReport[] = [];
  try {
    items = await storage.read();
  } catch {
    // No IndexedDB (a private window in some browsers): the queue is simply empty.
  }
  if (!state.loaded) setState({ loaded: true, items });
  return state.items;
}

export interface NewReport {
  report: CaseReport;
  photos: File[];
  readings: HandReading[];
  loggerFile: { file: File; roomId: number | null } | null;
}

/** Keeps a report on this device before its first try. Throws when the device cannot store it. */
export async function enqueueReport(userId: number, input: NewReport, now = new Date()): Promise<QueuedReport> {
  await loadQueue();
  const queued: QueuedReport = {
    id: newIdempotencyKey(),
    userId,
    queuedAt: now.toISOString(),
    ...input,
    keys: { case: newIdempotencyKey(), photos: newIdempotencyKey(), readings: newIdempotencyKey() },
  };
  await save([...state.items, queued]);
  return queued;
}

export async function removeQueued(id: string): Promise<void> {
  await loadQueue();
  await save(state.items.filter((r) => r.id !== id));
}

/** No signal, a dropped connection or a server that is down for a moment: worth trying again later. */
export function isTemporary(error: unknown): boolean {
  return !(error instanceof ApiError) || error.status === 0 || error.status >= 500;
}

const offline = () => typeof navigator !== "undefined" && navigator.onLine === false;

/**
 * Sends what is left of one queued report, part by part. "waiting" keeps it for the next try;
 * "refused" keeps it with the server's reason; "sent" has removed it from the device.
 */
export async function sendQueued(id: string, onStep?: (step: SendStep) => void): Promise<SendResult> {
  await loadQueue();
  let report = state.items.find((r) => r.id === id);
  if (!report) throw new Error(`No queued report ${id}.`);
  if (state.sending.includes(id)) return { kind: "waiting", report };
  // The phone knows it has no signal: don't spend the retries, just keep it.
  if (offline()) return { kind: "waiting", report };

  setState({ sending: [...state.sending, id] });
  let created: CreatedCase | null = null;
  let step: SendStep = "case";
  try {
    if (report.caseId === undefined) {
      onStep?.("case");
      try {
        created = await sender.createCase(report.report, report.keys.case);
      } catch (error) {
        // The case was made by an earlier try whose answer was lost, and the server no longer has
        // that answer: the report is with the landlord, so the copy here is done with.
        if (error instanceof ApiError && error.code === "already_applied") {
          await removeQueued(id);
          return { kind: "sent", created: null, report };
        }
        throw error;
      }
      const caseId = created.id;
      report = (await update(id, (r) => ({ ...r, caseId, refusal: undefined }))) ?? report;
    }
    const caseId = report.caseId!;
    if (!report.photosDone && report.photos.length) {
      step = "photos";
      onStep?.("photos");
      try {
        const { refused } = await sender.uploadPhotos(caseId, report.photos, report.keys.photos);
        const refusedPhotos = refused.map((r) => ({ name: r.name, message: r.reason }));
        report = (await update(id, (r) => ({ ...r, photos: [], photosDone: true, refusedPhotos }))) ?? report;
      } catch (error) {
        // None of the photos could be read: sending them again would not help, so they are left out.
        const refusedPhotos = refusedFromError(error);
        if (!refusedPhotos.length) throw error;
        report = (await update(id, (r) => ({ ...r, photos: [], photosDone: true, refusedPhotos }))) ?? report;
      }
    }
    if (!report.readingsDone && report.readings.length) {
      step = "readings";
      onStep?.("readings");
      await sender.addReadings(caseId, report.readings, report.keys.readings);
      report = (await update(id, (r) => ({ ...r, readings: [], readingsDone: true }))) ?? report;
    }
    await removeQueued(id);
    return { kind: "sent", created, report };
  } catch (error) {
    if (isTemporary(error)) {
      if (report.refusal) report = (await update(id, (r) => ({ ...r, refusal: undefined }))) ?? report;
      return { kind: "waiting", report };
    }
    const apiError = error as ApiError;
    const refusal = {
      status: apiError.status,
      code: apiError.code,
      message: errorMessage(apiError),
      ...(step === "case" ? {} : { step }),
      fields: apiError.fieldErrors.length ? apiError.fieldErrors : undefined,
    };
    report = (await update(id, (r) => ({ ...r, refusal }))) ?? report;
    return { kind: "refused", report, error: apiError };
  } finally {
    setState({ sending: state.sending.filter((s) => s !== id) });
  }
}

let flushing: Promise<SendResult[]> | null = null;

/**
 * Tries every report this person has waiting (one at a time; a second call while one runs shares it).
 * Reports the server refused stay as they are until the person asks to try again.
 */
export function flushQueue(userId: number): Promise<SendResult[]> {
  flushing ??= (async () => {
    try {
      const results: SendResult[] = [];
      for (const r of await loadQueue()) {
        if (r.userId !== userId || r.refusal) continue;
        const result = await sendQueued(r.id);
        results.push(result);
        if (result.kind === "waiting") break;
      }
      return results;
    } finally {
      flushing = null;
    }
  })();
  return flushing;
}
