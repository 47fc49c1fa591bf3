// Plain words for the values in the queue. Short forms: a table cell is narrow.
import { plural } from "@/lib/labels";
import type { QueueCategory } from "./queue-view";

// The words for the queue's values are shared with the server's export.
export { areaLabels, channelLabels, deadlineStageLabels, labelFor, plural, riskLabels } from "@/lib/labels";

export const categoryLabels: Record<QueueCategory, string> = {
  "1": "Category 1",
  "2": "Category 2",
  none: "Not assessed",
};

export const casesCount = (n: number) => plural(n, "case", "cases");
