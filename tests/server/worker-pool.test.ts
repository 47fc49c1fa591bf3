import { afterAll, describe, expect, it } from "vitest";
import { WorkerPool } from "../../server/workers/pool.js";

describe("worker pool", () => {
  const pool = new WorkerPool({ threads: 1, maxQueue: 2, memoryMb: 64 });
  afterAll(() => pool.close());

  it("runs a task on a worker thread and returns its result", async () => {
    await expect(pool.run("echo", { value: 42 })).resolves.toEqual({ value: 42 });
  });

  it("refuses work with 503 and Retry-After once its queue is full, and keeps serving", async () => {
    const runs = Array.from({ length: 8 }, (_, i) =>
      pool.run("echo", { value: i }).then(
        () => "done",
        (e: { status?: number; headers?: Record<string, string> }) => `${e.status} ${e.headers?.["Retry-After"]}`,
      ),
    );
    const outcomes = await Promise.all(runs);
    expect(outcomes).toContain("503 5");
    expect(outcomes).toContain("done");
    await expect(pool.run("echo", { value: 7 })).resolves.toEqual({ value: 7 });
  });
});
