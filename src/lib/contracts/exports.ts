// The columns of each table view that can be exported (CSV or .xlsx), in the order the screen shows
// them, with the same headings: one list per view, read by the server's export and by the tables.
// Values come from the same response shapes the tables show, and stored codes are written in the
// words the screen shows (the one map of each, in src/lib), so an export holds what the screen holds.
// No zod here: the queue's column headings load with the queue page, and its query schemas are the
// server's (export-query.ts).
import {
  areaLabels,
  channelLabels,
  labelFor,
  priorityLabels,
  riskLabels,
  sourceLabels,
  staffStatusLabel,
  userStatusLabels,
  windowShortLabels,
  workOrderStatusLabels,
  workTypeNames,
} from "../labels.js";
import { builtFormLabels, glazingTypeLabels, heatingTypeLabels, labelOf, ventilationLabels, wallTypeLabels } from "../homes.js";
import { nextDeadlineText } from "../deadline-words.js";
import { roleLabels } from "../roles.js";
import type { PropertySummaryResponse } from "./properties.js";
import type { ReadingResponse } from "./readings.js";
import type { QueueItemResponse } from "./triage.js";
import type { UserResponse } from "./users.js";
import type { WorkOrderResponse } from "./works.js";

export const EXPORT_FORMATS = ["csv", "xlsx"] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

/** Text, a real number (kept a number in .xlsx), yes/no, or empty. Times are ISO 8601 UTC text. */
export type ExportCell = string | number | boolean | null;

export interface ExportColumn<T> {
  id: string;
  header: string;
  value: (row: T) => ExportCell;
}

// ── The officers' queue ────────────────────────────────────────────────────────────────────────────

/** The queue's data columns; the ids are GET /api/cases's sort keys and the column chooser's (cols=…). */
export const QUEUE_COLUMN_IDS = [
  "reference",
  "priority",
  "address",
  "risk",
  "due",
  "status",
  "estate",
  "rooms",
  "awareAt",
  "channel",
  "mouldIndex",
  "area",
  "vulnerable",
  "band",
  "assignee",
] as const;
export type QueueColumnId = (typeof QUEUE_COLUMN_IDS)[number];

/** The heading of each queue column, on screen and in an export. */
export const QUEUE_COLUMN_LABELS: Record<QueueColumnId, string> = {
  reference: "Reference",
  address: "Home",
  estate: "Estate and block",
  rooms: "Rooms",
  awareAt: "Reported",
  channel: "Channel",
  risk: "Risk state",
  mouldIndex: "Mould index",
  area: "Affected area",
  vulnerable: "Vulnerable household",
  band: "HHSRS",
  priority: "Priority",
  due: "Next deadline",
  status: "Status",
  assignee: "Assigned to",
};

/** The optional columns shown until someone chooses others (the reference always shows). */
export const QUEUE_DEFAULT_COLUMNS: readonly QueueColumnId[] = ["priority", "address", "risk", "due", "status"];

/** `now`: the export's moment, for the time left to each deadline (as the screen shows it then). */
const queueValues = (now: number): Record<QueueColumnId, (r: QueueItemResponse) => ExportCell> => ({
  reference: (r) => r.reference ?? `Case ${r.id}`,
  priority: (r) => r.priority,
  address: (r) => `${r.property.addressLine1}, ${r.property.town}, ${r.property.postcode}`,
  risk: (r) => riskLabels[r.riskState ?? "unknown"],
  due: (r) => nextDeadlineText(r.nextDeadline, r.overdue, now),
  status: (r) => staffStatusLabel(r.status),
  estate: (r) => (r.property.block ? `${r.property.estate}, ${r.property.block}` : r.property.estate),
  rooms: (r) => r.rooms.map((room) => room.name).join(", "),
  awareAt: (r) => r.awareAt,
  channel: (r) => labelFor(channelLabels, r.channel),
  mouldIndex: (r) => r.mouldIndex,
  area: (r) => (r.area ? labelFor(areaLabels, r.area) : null),
  vulnerable: (r) => r.vulnerableHousehold,
  band: (r) => (r.hhsrs ? `Band ${r.hhsrs.band}, Category ${r.hhsrs.category}` : null),
  assignee: (r) => r.assignee?.name ?? null,
});

/**
 * The queue's export columns: the reference, then the shown ones in the screen's order. `now` (the
 * injectable clock's) is when the file is made: the next deadline says the time left as of then.
 */
export function queueExportColumns(
  now: Date,
  shown: readonly QueueColumnId[] = QUEUE_DEFAULT_COLUMNS,
): ExportColumn<QueueItemResponse>[] {
  const wanted = new Set<QueueColumnId>(["reference", ...shown]);
  const values = queueValues(now.getTime());
  return QUEUE_COLUMN_IDS.filter((id) => wanted.has(id)).map((id) => ({
    id,
    header: QUEUE_COLUMN_LABELS[id],
    value: values[id],
  }));
}

// ── Homes, work orders, accounts, a case's readings ─────────────────────────────────────────────────

export const HOME_EXPORT_COLUMNS: readonly ExportColumn<PropertySummaryResponse>[] = [
  { id: "address", header: "Address", value: (h) => [h.addressLine1, h.addressLine2].filter(Boolean).join(", ") },
  { id: "town", header: "Town", value: (h) => h.town },
  { id: "postcode", header: "Postcode", value: (h) => h.postcode },
  { id: "estate", header: "Estate", value: (h) => h.estate },
  { id: "block", header: "Block", value: (h) => h.block },
  { id: "builtForm", header: "Type", value: (h) => labelOf(builtFormLabels, h.builtForm) },
  { id: "wallType", header: "Walls", value: (h) => labelOf(wallTypeLabels, h.wallType) },
  { id: "glazingType", header: "Glazing", value: (h) => labelOf(glazingTypeLabels, h.glazingType) },
  { id: "heatingType", header: "Heating", value: (h) => labelOf(heatingTypeLabels, h.heatingType) },
  { id: "ventilation", header: "Ventilation", value: (h) => labelOf(ventilationLabels, h.ventilation) },
  // Text, not a number: a UPRN's leading digits and its length matter.
  { id: "uprn", header: "UPRN", value: (h) => h.uprn },
];

/**
 * What the work orders' export reads of an order: only its exported columns, so an export page is
 * one query for these fields rather than each order's case, home, rooms and bookings.
 */
export type WorkOrderExportRow = Pick<
  WorkOrderResponse,
  "id" | "caseId" | "caseReference" | "type" | "priority" | "targetDate" | "status" | "createdAt"
> & {
  property: Pick<WorkOrderResponse["property"], "addressLine1" | "town" | "postcode">;
  assignee: { name: string } | null;
  contractor: { name: string } | null;
  slot: Pick<NonNullable<WorkOrderResponse["slot"]>, "date" | "window"> | null;
};

export const WORK_ORDER_EXPORT_COLUMNS: readonly ExportColumn<WorkOrderExportRow>[] = [
  { id: "reference", header: "Reference", value: (w) => w.caseReference ?? `Case ${w.caseId}` },
  { id: "address", header: "Address", value: (w) => `${w.property.addressLine1}, ${w.property.town}, ${w.property.postcode}` },
  { id: "type", header: "Type", value: (w) => labelFor(workTypeNames, w.type) },
  { id: "priority", header: "Priority", value: (w) => labelFor(priorityLabels, w.priority) },
  { id: "target", header: "Target date", value: (w) => w.targetDate },
  { id: "status", header: "Status", value: (w) => labelFor(workOrderStatusLabels, w.status) },
  { id: "who", header: "Operative or contractor", value: (w) => w.assignee?.name ?? w.contractor?.name ?? null },
  { id: "slot", header: "Visit", value: (w) => (w.slot ? `${w.slot.date} ${labelFor(windowShortLabels, w.slot.window)}` : null) },
  { id: "created", header: "Raised", value: (w) => w.createdAt },
];

export const USER_EXPORT_COLUMNS: readonly ExportColumn<UserResponse>[] = [
  { id: "name", header: "Name", value: (u) => u.name },
  { id: "email", header: "E-mail", value: (u) => u.email },
  { id: "role", header: "Role", value: (u) => labelFor(roleLabels, u.role) },
  { id: "status", header: "Status", value: (u) => labelFor(userStatusLabels, u.status) },
  { id: "lastSignInAt", header: "Last sign-in", value: (u) => u.lastSignInAt },
];

/** A reading with its room's name, as the case's readings table shows it. */
export type ReadingExportRow = ReadingResponse & { roomName: string };

export const READING_EXPORT_COLUMNS: readonly ExportColumn<ReadingExportRow>[] = [
  { id: "takenAt", header: "Taken at (UTC)", value: (r) => r.takenAt },
  { id: "room", header: "Room", value: (r) => r.roomName },
  { id: "airTemperatureC", header: "Air temperature (°C)", value: (r) => r.airTemperatureC },
  { id: "relativeHumidityPct", header: "Relative humidity (%)", value: (r) => r.relativeHumidityPct },
  { id: "surfaceTemperatureC", header: "Surface temperature (°C)", value: (r) => r.surfaceTemperatureC },
  { id: "outdoorTemperatureC", header: "Outdoor temperature (°C)", value: (r) => r.outdoorTemperatureC },
  { id: "source", header: "Source", value: (r) => labelFor(sourceLabels, r.source) },
];
