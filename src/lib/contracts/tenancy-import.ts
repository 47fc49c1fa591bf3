// A landlord's tenancy file brought in by an admin (POST /api/tenancy-imports…) and the invitations it
// queues, released a few at a time (their progress, pause, resume, cancel).
import { z } from "zod";
import { id, instant } from "./common.js";

/** The fields a tenancy file may hold, in the order the preview lists them. */
export const TENANCY_FIELDS = [
  "reference",
  "uprn",
  "name",
  "firstName",
  "lastName",
  "email",
  "phone",
  "startDate",
  "endDate",
  "language",
  "accessNeeds",
  "vulnerability",
  "consent",
] as const;
export type TenancyField = (typeof TENANCY_FIELDS)[number];

/** Each field's column (an index from 0), or null when the file has none. */
export const tenancyMapping = z.object(
  Object.fromEntries(TENANCY_FIELDS.map((f) => [f, z.number().int().min(0).nullable()])) as Record<
    TenancyField,
    z.ZodNullable<z.ZodNumber>
  >,
);
export type TenancyMapping = z.infer<typeof tenancyMapping>;

/** POST /api/tenancy-imports/preview: how the server reads the file, for the admin to correct. */
export const tenancyImportPreviewResponse = z.object({
  fileKind: z.enum(["csv", "xlsx"]),
  headers: z.array(z.string()),
  mapping: tenancyMapping,
  /** Required fields the file seems not to have. */
  missing: z.array(z.string()),
  sampleRows: z.array(z.array(z.string())),
  rows: z.number().int().min(0),
});
export type TenancyImportPreview = z.infer<typeof tenancyImportPreviewResponse>;

export const TENANCY_ROW_OUTCOMES = ["created", "updated", "unchanged", "rejected"] as const;
export type TenancyRowOutcome = (typeof TENANCY_ROW_OUTCOMES)[number];

/** One row of the file and what became of it. `row` counts as a spreadsheet does (the header is row 1). */
export const tenancyRowReport = z.object({
  row: z.number().int().min(1),
  reference: z.string(),
  outcome: z.enum(TENANCY_ROW_OUTCOMES),
  /** For "updated": what changed ("end date", "phone", …). */
  changes: z.array(z.string()),
  /** Why a row was rejected, or what was not stored and why. */
  reasons: z.array(z.string()),
});
export type TenancyRowReport = z.infer<typeof tenancyRowReport>;

export const invitationProgress = z.object({
  batchId: id,
  total: z.number().int().min(0),
  sent: z.number().int().min(0),
  skipped: z.number().int().min(0),
  cancelled: z.number().int().min(0),
  pending: z.number().int().min(0),
  state: z.enum(["sending", "paused", "cancelled", "done"]),
  nextReleaseAt: instant.nullable(),
});
export type InvitationProgress = z.infer<typeof invitationProgress>;

export const tenancyImportSummary = z.object({
  id,
  fileName: z.string(),
  createdAt: instant,
  createdBy: z.string(),
  rows: z.number().int().min(0),
  created: z.number().int().min(0),
  updated: z.number().int().min(0),
  unchanged: z.number().int().min(0),
  rejected: z.number().int().min(0),
  invitations: invitationProgress.nullable(),
});
export type TenancyImportSummary = z.infer<typeof tenancyImportSummary>;

/** The most rows one tenancy file may hold, and its largest size: shown beside the upload, enforced by the server. */
export const TENANCY_IMPORT_MAX_ROWS = 150_000;
export const TENANCY_IMPORT_MAX_MB = 50;

/** The most rows worth a look that POST /api/tenancy-imports answers with; the CSV report has every row. */
export const TENANCY_IMPORT_NOTABLE_ROWS = 200;

/**
 * POST /api/tenancy-imports: the import, and its rows worth a look (added, updated, not imported, or with a
 * note), the first TENANCY_IMPORT_NOTABLE_ROWS of them in row order, with how many there are in all. The
 * report of every row (up to 150 000) is the CSV download, not this answer.
 */
export const tenancyImportResultResponse = tenancyImportSummary.extend({
  notable: z.array(tenancyRowReport),
  notableTotal: z.number().int().min(0),
});
export type TenancyImportResult = z.infer<typeof tenancyImportResultResponse>;

/** GET /api/tenancy-imports: the landlord's latest imports. */
export const tenancyImportListResponse = z.object({ items: z.array(tenancyImportSummary) });
