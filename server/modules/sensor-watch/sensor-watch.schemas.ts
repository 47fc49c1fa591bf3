import { z } from "zod";
import { ALERT_SORTS } from "../../../src/lib/contracts/sensor-watch.js";

export const alertListQuery = z
  .object({
    sort: z.enum(ALERT_SORTS, { error: `sort must be one of ${ALERT_SORTS.join(", ")}.` }).default("raisedAt"),
    dir: z.enum(["asc", "desc"], { error: "dir must be asc or desc." }).default("desc"),
  })
  .strict();

export const dismissAlertSchema = z
  .object({
    reason: z
      .string({ error: "Say why the alert is dismissed." })
      .trim()
      .min(3, "Say why the alert is dismissed.")
      .max(500, "Please keep the reason under 500 characters."),
  })
  .strict();
