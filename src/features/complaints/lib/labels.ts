import type { ComplaintStatus } from "@/lib/contracts";

/** Where a complaint stands, in words for staff and tenant alike (our wording). */
export const COMPLAINT_STATUS_LABELS: Record<ComplaintStatus, string> = {
  "stage-1-received": "Stage 1: waiting for acknowledgement",
  "stage-1-acknowledged": "Stage 1: acknowledged, response due",
  "stage-1-responded": "Stage 1: responded",
  "stage-2-received": "Stage 2: waiting for acknowledgement",
  "stage-2-acknowledged": "Stage 2: acknowledged, final response due",
  closed: "Closed",
};

export const CLOCK_STATE_LABELS: Record<string, string> = {
  pending: "Due",
  met: "In time",
  missed: "Late",
  "not-started": "Not started",
};

/** "£150.50" from pence. */
export const formatPounds = (pence: number): string =>
  `£${Math.floor(pence / 100).toLocaleString("en-GB")}.${String(pence % 100).padStart(2, "0")}`;

/** "150.50" → 15050; null for an empty box; NaN for anything else (the form says so). */
export function penceFrom(text: string): number | null {
  const t = text.trim().replace(/^£/, "");
  if (t === "") return null;
  if (!/^\d+(\.\d{1,2})?$/.test(t)) return Number.NaN;
  const [pounds, fraction = ""] = t.split(".");
  return Number(pounds) * 100 + Number(fraction.padEnd(2, "0"));
}

export const isOpen = (status: ComplaintStatus) => status !== "closed";
