export const myHomeKeys = {
  all: ["my-home"] as const,
  current: () => [...myHomeKeys.all, "current"] as const,
};
