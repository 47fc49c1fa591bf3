/** Keys of the report feature's mutations (its reads live with the cases they belong to). */
export const reportKeys = {
  all: ["report"] as const,
  create: () => [...reportKeys.all, "create"] as const,
  photos: (caseId: number) => [...reportKeys.all, caseId, "photos"] as const,
  readings: (caseId: number) => [...reportKeys.all, caseId, "readings"] as const,
  importPreview: (caseId: number) => [...reportKeys.all, caseId, "import-preview"] as const,
  import: (caseId: number) => [...reportKeys.all, caseId, "import"] as const,
};
