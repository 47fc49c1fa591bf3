import type { SensorProblemName } from "@/lib/contracts";

/** Each problem in a few words, as lists and badges show it. */
export const sensorProblemLabels: Record<SensorProblemName, string> = {
  offline: "Offline",
  "low-battery": "Low battery",
  "flat-lined": "Flat-lined",
  jumping: "Jumping values",
};

/** Each problem's next step, for the lead (our own advice). */
export const sensorProblemHelp: Record<SensorProblemName, string> = {
  offline: "Check its power and signal, or whether it has been taken down.",
  "low-battery": "Change the battery at the next visit.",
  "flat-lined": "The sensor may be stuck: check it, and replace it if it stays the same.",
  jumping: "The readings change faster than a room can: check the sensor's placement and probe.",
};
