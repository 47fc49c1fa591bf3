import { evaluateSeriesRequest } from "../modules/psychrometrics/series.task.js";

// Everything the worker pool can run, by name. Each task is a plain function of structured-clonable
// input to structured-clonable output: CPU-heavy work (engine series, big evaluations, image decoding)
// that must not hold up the request thread. Add a task here and it is callable through WorkerPool.run.
export const tasks = {
  /** A trivial task, so the pool's own wiring can be tested and warmed up. */
  echo: (input: { value: number }): { value: number } => ({ value: input.value }),
  /** The public calculator's series: JSON in, the engine's evaluation (or the 400's details) out. */
  evaluateSeriesRequest,
};

export type Tasks = typeof tasks;
export type TaskName = keyof Tasks;
