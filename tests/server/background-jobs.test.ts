// Shutdown stops the background jobs and waits for a run already in progress, so the database is
// closed after it and not under it. Each job here runs against a stand-in whose run we finish by hand.
import { pino } from "pino";
import { expect, it } from "vitest";
import type { DigestRun } from "../../server/modules/digest/digest.service.js";
import { startDigestScheduler } from "../../server/modules/digest/digest.scheduler.js";
import { startTriageSweeper } from "../../server/modules/triage/triage.sweeper.js";
import { startMonitoringReminders } from "../../server/modules/works/monitoring.scheduler.js";

const logger = pino({ level: "silent" });

/** A job's work that starts when called and finishes only when `finish()` is called. */
function heldRun<T>(value: T) {
  const state = { calls: 0, finished: false, finish: () => {} };
  const run = () => {
    state.calls += 1;
    return new Promise<T>((resolve) => {
      state.finish = () => {
        state.finished = true;
        resolve(value);
      };
    });
  };
  return { state, run };
}

async function until(condition: () => boolean) {
  for (let i = 0; i < 500 && !condition(); i++) await new Promise((r) => setTimeout(r, 10));
  expect(condition()).toBe(true);
}

/** Stops the job while its run is held; the stop resolves only after the run has finished. */
async function expectStopWaitsForRun(stop: () => Promise<void>, state: { calls: number; finished: boolean; finish: () => void }) {
  await until(() => state.calls === 1);
  let stopped = false;
  const stopping = stop().then(() => {
    stopped = true;
  });
  // Every promise callback that could run without the held run finishing has run by now.
  await new Promise((r) => setImmediate(r));
  expect(stopped).toBe(false);
  state.finish();
  await stopping;
  expect(state.finished).toBe(true);
  expect(state.calls).toBe(1);
}

it("stopping the triage sweep waits for the sweep in progress", async () => {
  const { state, run } = heldRun(0);
  const stop = startTriageSweeper({ refreshStale: run }, logger, { everyMs: 5 });
  await expectStopWaitsForRun(stop, state);
});

it("stopping the monitoring reminders waits for the run in progress", async () => {
  const { state, run } = heldRun(0);
  const stop = startMonitoringReminders({ sendDueReminders: run }, logger, { everyMs: 5 });
  await expectStopWaitsForRun(stop, state);
});

it("stopping the digest scheduler waits for the digests being sent", async () => {
  const { state, run } = heldRun<DigestRun>({ date: "2024-12-10", workingDay: true, sent: 0, alreadySent: 0, failed: 0 });
  const scheduler = startDigestScheduler(
    { digest: { sendDue: run }, triage: { refreshStale: async () => 0 } },
    logger,
    // 08:00 in London (GMT in December), after the digest hour.
    { clock: () => new Date("2024-12-10T08:00:00Z"), intervalMs: 3_600_000, firstCheckMs: 3_600_000 },
  );
  void scheduler.check();
  await expectStopWaitsForRun(() => scheduler.stop(), state);
});
