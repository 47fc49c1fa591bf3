// The sensors' query keys, general to specific. Here rather than in src/lib/query-keys.ts while only
// this feature reads sensors; move them there when another feature does.
export interface SensorListFilters {
  propertyId: number | undefined;
  state: "" | "active" | "revoked" | "removed";
  page: number;
  pageSize: number;
}

export const sensorKeys = {
  all: ["sensors"] as const,
  lists: () => [...sensorKeys.all, "list"] as const,
  list: (filters: SensorListFilters) => [...sensorKeys.lists(), filters] as const,
  home: (propertyId: number) => [...sensorKeys.lists(), "home", propertyId] as const,
  details: () => [...sensorKeys.all, "detail"] as const,
  detail: (id: number) => [...sensorKeys.details(), id] as const,
  readings: (id: number, window: { hours: number }) => [...sensorKeys.detail(id), "readings", window] as const,
};
