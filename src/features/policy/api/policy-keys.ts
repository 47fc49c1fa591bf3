export const policyKeys = {
  all: ["policy"] as const,
  current: () => [...policyKeys.all, "current"] as const,
};
