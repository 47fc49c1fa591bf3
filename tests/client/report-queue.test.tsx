// The queue of reports kept on the phone, with a storage and a sender of its own: each part keeps
// the key it was first given across tries, no signal keeps the report, a refusal keeps it with the
// reason, and only a report whose every part went leaves the phone.
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { ApiError } from "@/lib/api-client";
import type { CaseReport } from "@/lib/schemas/case-report";
import {
  enqueueReport,
  flushQueue,
  getQueueState,
  sendQueued,
  setQueueBackends,
  type QueuedReport,
  type ReportSender,
} from "@/features/report/lib/report-queue";

const report = { description: "Mould in the bathroom ceiling corner above the shower." } as unknown as CaseReport;
const reading = { roomId: 3, takenAt: "2026-11-02T08:00:00.000Z", airTemperatureC: 18, relativeHumidityPct: 71 };
const noSignal = () => new ApiError(0, "network_error", "We could not reach Dewline.");

let stored: QueuedReport[] = [];
let calls: { part: string; key: string | undefined }[] = [];

function makeSender(fail: Partial<Record<"case" | "photos" | "readings", () => Error>> = {}): ReportSender {
  return {
    createCase: vi.fn(async (_r: CaseReport, key?: string) => {
      calls.push({ part: "case", key });
      const error = fail.case?.();
      if (error) throw error;
      return { id: 41, reference: "DW-2026-00041", status: "new", createdAt: "2026-11-02T08:05:00.000Z" } as never;
    }),
    uploadPhotos: vi.fn(async (_id: number, _files: readonly File[], key?: string) => {
      calls.push({ part: "photos", key });
      const error = fail.photos?.();
      if (error) throw error;
      return { photos: [{}], refused: [] } as never;
    }),
    addReadings: vi.fn(async (_id: number, _items: unknown, key?: string) => {
      calls.push({ part: "readings", key });
      const error = fail.readings?.();
      if (error) throw error;
      return {} as never;
    }),
  };
}

function withBackends(sender: ReportSender) {
  setQueueBackends({
    storage: {
      read: async () => stored,
      write: async (items) => {
        stored = items;
      },
    },
    sender,
  });
}

const newReport = () => ({
  report,
  photos: [new File(["jpeg bytes"], "ceiling.jpg", { type: "image/jpeg" })],
  readings: [reading],
  loggerFile: null,
});

beforeEach(() => {
  stored = [];
  calls = [];
  vi.stubGlobal("navigator", { onLine: true });
});
afterEach(() => setQueueBackends({}));

describe("report queue", () => {
  it("keeps the report on the phone with no signal, then sends it once with the key it was first given", async () => {
    let signal = false;
    withBackends(makeSender({ case: () => (signal ? undefined : noSignal()) as Error }));
    const queued = await enqueueReport(7, newReport());
    expect(stored).toHaveLength(1);

    const first = await sendQueued(queued.id);
    expect(first.kind).toBe("waiting");
    expect(stored).toHaveLength(1);
    expect(stored[0]!.photos[0]!.name).toBe("ceiling.jpg");

    signal = true;
    const [second] = await flushQueue(7);
    expect(second!.kind).toBe("sent");
    expect(stored).toEqual([]);
    const caseKeys = calls.filter((c) => c.part === "case").map((c) => c.key);
    expect(caseKeys).toHaveLength(2);
    expect(new Set(caseKeys).size).toBe(1);
    expect(caseKeys[0]).toBe(queued.keys.case);
    expect(calls.map((c) => c.part)).toEqual(["case", "case", "photos", "readings"]);
  });

  it("does not make the case again when only the photos were left, and sends them with their own key", async () => {
    let photoSignal = false;
    withBackends(makeSender({ photos: () => (photoSignal ? undefined : noSignal()) as Error }));
    const queued = await enqueueReport(7, newReport());
    expect((await sendQueued(queued.id)).kind).toBe("waiting");
    expect(stored[0]!.caseId).toBe(41);

    photoSignal = true;
    expect((await sendQueued(queued.id)).kind).toBe("sent");
    expect(calls.map((c) => c.part)).toEqual(["case", "photos", "photos", "readings"]);
    const photoKeys = calls.filter((c) => c.part === "photos").map((c) => c.key);
    expect(photoKeys).toEqual([queued.keys.photos, queued.keys.photos]);
  });

  it("keeps a refused report with the server's reason, and the automatic sending leaves it alone", async () => {
    withBackends(
      makeSender({
        case: () =>
          new ApiError(400, "validation_error", "Check your answers.", [
            { field: "description", message: "Tell us a bit more." },
          ]),
      }),
    );
    const queued = await enqueueReport(7, newReport());
    const result = await sendQueued(queued.id);
    expect(result.kind).toBe("refused");
    expect(stored[0]!.refusal).toMatchObject({ status: 400, fields: [{ field: "description", message: "Tell us a bit more." }] });

    expect(await flushQueue(7)).toEqual([]);
    expect(calls).toHaveLength(1);
  });

  it("does not try while the phone says it is offline, and sends only the signed-in person's reports", async () => {
    withBackends(makeSender());
    await enqueueReport(7, newReport());
    const other = await enqueueReport(8, newReport());
    vi.stubGlobal("navigator", { onLine: false });
    expect((await flushQueue(7))[0]!.kind).toBe("waiting");
    expect(calls).toEqual([]);

    vi.stubGlobal("navigator", { onLine: true });
    await flushQueue(7);
    expect(getQueueState().items.map((r) => r.id)).toEqual([other.id]);
    expect(stored.map((r) => r.userId)).toEqual([8]);
  });
});
