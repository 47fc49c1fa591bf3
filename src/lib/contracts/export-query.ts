// The export routes' query parameters, as zod schemas (read by the server's route schemas). Apart from
// exports.ts, whose columns and headings load with the client's tables without zod.
import { z } from "zod";
import { EXPORT_FORMATS, QUEUE_COLUMN_IDS, type QueueColumnId } from "./exports.js";

/** `format=csv|xlsx` (csv when left out), shared by every export route. */
export const exportFormatSchema = z.enum(EXPORT_FORMATS, { error: "format must be csv or xlsx." }).default("csv");

/** `columns=` of the queue's export: a comma list of column ids (unknown ids are refused). */
export const queueColumnsSchema = z
  .string()
  .trim()
  .transform((raw, ctx) => {
    if (raw === "none") return [];
    const given = raw
      .split(",")
      .map((v) => v.trim())
      .filter(Boolean);
    const strange = given.filter((v) => !(QUEUE_COLUMN_IDS as readonly string[]).includes(v));
    if (strange.length) {
      ctx.addIssue({ code: "custom", message: `columns: ${strange.join(", ")} is not one of ${QUEUE_COLUMN_IDS.join(", ")}.` });
      return z.NEVER;
    }
    return given as QueueColumnId[];
  });
