import type { QueueListParams } from "../lib/queue-view";

/**
 * The queue lives under the cases namespace (see src/features/cases/api/cases-keys.ts), so that
 * invalidating ["cases"] after a change to any case refreshes the queue as well.
 */
export const queueKeys = {
  cases: ["cases"] as const,
  all: ["cases", "queue"] as const,
  lists: () => [...queueKeys.all, "list"] as const,
  list: (params: QueueListParams) => [...queueKeys.lists(), params] as const,
};
