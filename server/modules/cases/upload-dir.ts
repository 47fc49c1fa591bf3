import { readdir, rm, stat } from "node:fs/promises";
import path from "node:path";

/**
 * Where multer writes uploads (photos and readings CSVs) before they are processed: inside the app's
 * own uploads folder (so not shared with every other instance on the machine, and on the same disk
 * as the photos). Files are removed once processed; a crash's leftovers by removeStaleIncoming.
 */
export const incomingDir = (uploadsDir: string): string => path.join(uploadsDir, ".incoming");

/** An upload still being received keeps its file's time fresh; one untouched this long was left by a crash. */
export const STALE_INCOMING_MS = 15 * 60_000;

/**
 * Removes what a crash left in the incoming folder: files not written to for STALE_INCOMING_MS
 * (real file times, not the app's clock). Younger files may belong to another instance sharing
 * the folder, mid-upload. Answers how many were removed.
 */
export async function removeStaleIncoming(uploadsDir: string, nowMs = Date.now()): Promise<number> {
  const dir = incomingDir(uploadsDir);
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return 0;
  }
  let removed = 0;
  for (const name of names) {
    const file = path.join(dir, name);
    const info = await stat(file).catch(() => null);
    if (!info || nowMs - info.mtimeMs < STALE_INCOMING_MS) continue;
    await rm(file, { recursive: true, force: true });
    removed++;
  }
  return removed;
}
