import { decodePhoto } from "../modules/photos/photo-processing.js";
import { evaluateSeriesRequest } from "../modules/psychrometrics/series.task.js";
import { evaluateRoomFromDb } from "../modules/readings/room-evaluation.task.js";

// Everything the worker pool can run, by name. Each task is a plain function of structured-clonable
// input to structured-clonable output: CPU-heavy work (engine series, big evaluations, image decoding)
// that must not hold up the request thread. Add a task here and it is callable through WorkerPool.run.

export const tasks = {
  /** A trivial task, so the pool's own wiring can be tested and warmed up. */
  echo: (input: { value: number }): { value: number } => ({ value: input.value }),
  /** Decodes an uploaded photo into its display copy and thumbnail, with sharp's own limits (PhotoService). */
  decodePhoto,
  /** The public calculator's series: JSON in, the engine's evaluation (or the 400's details) out. */
  evaluateSeriesRequest,
  /** One room of a case: its readings read from the database and evaluated (ReadingService.roomEvaluations). */
  evaluateRoomFromDb,
};

export type Tasks = typeof tasks;
export type TaskName = keyof Tasks;
