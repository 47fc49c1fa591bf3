import type { SensorResponse } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";

export const sensorStateLabels: Record<SensorResponse["state"], string> = {
  active: "Sending",
  revoked: "Secret revoked",
  removed: "Removed",
};

/** "Never" or the London time of the newest reading stored. */
export const lastSeen = (sensor: Pick<SensorResponse, "lastReadingAt">) =>
  sensor.lastReadingAt ? formatDateTime(sensor.lastReadingAt) : "Never";

export const intervalLabel = (seconds: number) =>
  seconds % 3600 === 0 ? `${seconds / 3600} h` : seconds % 60 === 0 ? `${seconds / 60} min` : `${seconds} s`;
