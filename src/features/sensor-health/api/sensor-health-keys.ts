/** Query keys for sensor health, general to specific: the summary, the lists of sensors needing attention, one sensor. */
export const sensorHealthKeys = {
  all: ["sensor-health"] as const,
  summary: () => [...sensorHealthKeys.all, "summary"] as const,
  lists: () => [...sensorHealthKeys.all, "list"] as const,
  list: <F extends object>(filters: F) => [...sensorHealthKeys.lists(), filters] as const,
  detail: (sensorId: number) => [...sensorHealthKeys.all, "detail", sensorId] as const,
};
