/** From general to specific: invalidating `detail(id)` refreshes everything about one case. */
export const caseKeys = {
  all: ["cases"] as const,
  lists: () => [...caseKeys.all, "list"] as const,
  mine: () => [...caseKeys.lists(), "mine"] as const,
  details: () => [...caseKeys.all, "detail"] as const,
  detail: (id: number) => [...caseKeys.details(), id] as const,
  events: (id: number) => [...caseKeys.detail(id), "events"] as const,
  photos: (id: number) => [...caseKeys.detail(id), "photos"] as const,
  readings: (id: number, roomId?: number) => [...caseKeys.detail(id), "readings", { roomId: roomId ?? null }] as const,
  evaluation: (id: number) => [...caseKeys.detail(id), "evaluation"] as const,
};
