import type { z } from "zod";
import type {
  sensorAttentionItem,
  sensorHealthFinding,
  sensorHealthResponse,
  sensorHealthSummaryResponse,
} from "../../../src/lib/contracts/sensor-health.js";
import type { SensorHealthFinding } from "../../../src/lib/domain/sensor-health.js";
import type { SensorAttentionRow, SensorHealthSummary, SensorHealthView } from "./sensor-health.service.js";

const toFindingDto = (f: SensorHealthFinding): z.input<typeof sensorHealthFinding> => ({
  problem: f.problem,
  since: f.since.toISOString(),
  reason: f.reason,
});

export const toSensorHealthDto = (h: SensorHealthView): z.input<typeof sensorHealthResponse> => ({
  sensorId: h.sensorId,
  serial: h.serial,
  intervalS: h.intervalS,
  lastReadingAt: h.lastReadingAt?.toISOString() ?? null,
  ok: h.ok,
  findings: h.findings.map(toFindingDto),
  checkedAt: h.checkedAt.toISOString(),
});

export const toSensorHealthSummaryDto = (s: SensorHealthSummary): z.input<typeof sensorHealthSummaryResponse> => ({
  ...s,
  oldestCheckAt: s.oldestCheckAt?.toISOString() ?? null,
  at: s.at.toISOString(),
});

export const toSensorAttentionDto = (r: SensorAttentionRow): z.input<typeof sensorAttentionItem> => ({
  ...r,
  lastReadingAt: r.lastReadingAt?.toISOString() ?? null,
  findings: r.findings.map(toFindingDto),
  checkedAt: r.checkedAt?.toISOString() ?? null,
});
