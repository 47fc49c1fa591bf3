// The monthly board report (GET /api/board-report?month=YYYY-MM is the PDF itself): the admin's list of
// addresses it is e-mailed to, and the answer to sending it now.
import { z } from "zod";
import { instant } from "./common.js";

const month = z.string().regex(/^\d{4}-\d{2}$/);

/** GET/PUT /api/board-report/settings. */
export const boardReportSettingsResponse = z.object({
  recipients: z.array(z.string()),
  /** The latest month e-mailed to the list, and when. */
  lastSent: z.object({ month, sentAt: instant }).nullable(),
});
export type BoardReportSettings = z.infer<typeof boardReportSettingsResponse>;

/** POST /api/board-report/send: how many e-mails were queued (0 when the list is empty). */
export const boardReportSentResponse = z.object({ month, emails: z.number().int().min(0) });
export type BoardReportSent = z.infer<typeof boardReportSentResponse>;
