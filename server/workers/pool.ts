// One pool of worker threads for the whole server (piscina), with bounded threads, a bounded queue and
// a memory cap per thread, so heavy work neither blocks the event loop nor piles up without limit.
import { Piscina } from "piscina";
import { ServiceUnavailableError } from "../lib/errors.js";
import type { TaskName, Tasks } from "./tasks.js";

export interface WorkerPoolOptions {
  threads: number;
  /** Tasks that may wait for a thread; more are refused at once with 503. */
  maxQueue: number;
  /** Old-generation heap limit of each thread, in MB. */
  memoryMb: number;
}

// Under tsx or vitest this file is TypeScript, and so is the worker: the threads load tsx too.
const fromSource = import.meta.url.endsWith(".ts");

export class WorkerPool {
  private readonly piscina: Piscina;

  constructor(options: WorkerPoolOptions) {
    this.piscina = new Piscina({
      filename: new URL(fromSource ? "./worker.ts" : "./worker.js", import.meta.url).href,
      execArgv: fromSource ? ["--import", "tsx"] : [],
      minThreads: 0,
      maxThreads: options.threads,
      maxQueue: options.maxQueue,
      idleTimeout: 30_000,
      resourceLimits: { maxOldGenerationSizeMb: options.memoryMb },
    });
  }

  /** Runs a task on a worker thread; 503 with Retry-After when the queue is full. */
  async run<K extends TaskName>(task: K, input: Parameters<Tasks[K]>[0]): Promise<Awaited<ReturnType<Tasks[K]>>> {
    if (this.piscina.queueSize >= this.piscina.options.maxQueue) {
      throw new ServiceUnavailableError("The server is busy with other heavy work. Please try again in a moment.", 5);
    }
    return (await this.piscina.run({ task, input })) as Awaited<ReturnType<Tasks[K]>>;
  }

  get stats() {
    return { threads: this.piscina.threads.length, queued: this.piscina.queueSize, completed: this.piscina.completed };
  }

  async close(): Promise<void> {
    await this.piscina.destroy();
  }
}
