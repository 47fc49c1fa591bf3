import type { Logger } from "../../lib/logger.js";

/**
 * Work that must not hold up (or show in the timing of) the reply: it starts only after the current
 * request's handler has returned. A failure is logged, never thrown at anyone. `settled()` resolves
 * once nothing is running (shutdown waits for it; tests wait for it instead of for time).
 */
export class AfterReply {
  private readonly running = new Set<Promise<void>>();

  constructor(private readonly logger: Logger) {}

  run(name: string, task: () => Promise<void>): void {
    const job = new Promise<void>((resolve) => setImmediate(resolve))
      .then(task)
      .catch((err: unknown) => this.logger.error({ err, task: name }, "work after the reply failed"))
      .finally(() => this.running.delete(job));
    this.running.add(job);
  }

  async settled(): Promise<void> {
    while (this.running.size) await Promise.allSettled([...this.running]);
  }
}
