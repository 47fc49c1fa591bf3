// Everything the worker pool can run, by name. Each task is a plain function of structured-clonable
// input to structured-clonable output: CPU-heavy work (engine series, big evaluations, image decoding)
// that must not hold up the request thread. Add a task here and it is callable through WorkerPool.run.
import { decodePhoto } from "../modules/photos/photo-processing.js";

export const tasks = {
  /** A trivial task, so the pool's own wiring can be tested and warmed up. */
  echo: (input: { value: number }): { value: number } => ({ value: input.value }),
  /** Decodes an uploaded photo into its display copy and thumbnail, with sharp's own limits (PhotoService). */
  decodePhoto,
};

export type Tasks = typeof tasks;
export type TaskName = keyof Tasks;
