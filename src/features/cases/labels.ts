// Plain words for a case's status and for what has happened to it. Written for the person who
// reported; staff views can pass their own audience later.
import type { CaseStatus } from "@/lib/schemas/case-report";
import { humanise, staffStatusLabel } from "@/lib/labels";

// Staff's words for a status, a reading's source and the fallback for unknown values are shared with the server's exports.
export { humanise, sourceLabels, staffStatusLabels } from "@/lib/labels";

export const statusLabels: Record<CaseStatus, { label: string; meaning: string }> = {
  new: { label: "Sent", meaning: "Your landlord has your report and will look at it soon." },
  triaged: { label: "Being looked into", meaning: "Your landlord has read your report and is deciding what to do first." },
  "inspection-booked": { label: "Visit booked", meaning: "Someone is coming to look at the damp or mould in your home." },
  investigated: {
    label: "Inspected",
    meaning: "Your home has been looked at. Your landlord will write to you about what was found and what happens next.",
  },
  "works-planned": { label: "Repair planned", meaning: "Repair work has been planned." },
  "works-done": { label: "Repair done", meaning: "The repair work has been done." },
  monitoring: { label: "Checking it lasts", meaning: "Your landlord is checking that the problem stays fixed." },
  closed: { label: "Finished", meaning: "This report is finished. If the damp or mould comes back, please report it again." },
  cancelled: { label: "Withdrawn", meaning: "This report was withdrawn." },
};

/** Facts beyond the status that change what the tenant is told. */
export interface TenantStageFacts {
  /** The written summary of the inspection has been sent to the tenant. */
  summarySent?: boolean;
}

/**
 * The tenant's plain-words stage: the status, with the written summary told apart, so the words
 * move with the work (inspected, then findings sent, then a repair planned).
 */
export function tenantStage(status: string, facts: TenantStageFacts = {}): { label: string; meaning?: string } {
  if (status === "investigated" && facts.summarySent) {
    return {
      label: "Findings sent to you",
      meaning: "Your landlord has written to you about what was found and what happens next. The letter is on this page too.",
    };
  }
  return { label: statusLabel(status), meaning: statusMeaning(status) };
}

export type Audience = "tenant" | "staff";

export function statusLabelFor(audience: Audience): (status: string) => string {
  return audience === "staff" ? staffStatusLabel : statusLabel;
}

export function statusLabel(status: string): string {
  return (statusLabels as Record<string, { label: string }>)[status]?.label ?? humanise(status);
}

export function statusMeaning(status: string): string | undefined {
  return (statusLabels as Record<string, { meaning: string }>)[status]?.meaning;
}

/**
 * What the readings over time point to (the engine's diagnosis kinds), said about the home.
 * `staffNote` replaces `note` on staff screens, where the tenant-facing promise reads wrongly.
 */
export const diagnosisLabels: Record<string, { title: string; note?: string; staffNote?: string }> = {
  "ventilation-or-moisture-load": { title: "The air indoors holds a lot of moisture for the ventilation the room has" },
  "cold-surface": { title: "A surface in this room runs colder than it should" },
  "likely-not-condensation": {
    title: "This may not be condensation: water could be getting in",
    note: "A leak, or damp coming through a wall or up from the ground, needs a survey to find.",
  },
  "no-risk-found": {
    title: "These readings didn't show condensation or mould-growth conditions",
    note: "Damp comes and goes with the weather, and some causes don't show in readings. Your landlord will still look into your report.",
    staffNote:
      "Damp comes and goes with the weather, and some causes don't show in readings: investigate the report whatever they show.",
  },
  "insufficient-data": {
    title: "Not enough readings yet to see a pattern",
    note: "Readings over at least a day, or a logger left for a week or two, show much more.",
  },
};
