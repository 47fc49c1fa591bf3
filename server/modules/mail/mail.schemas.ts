import { z } from "zod";
import { OUTBOX_STATUSES } from "./outbox-email.entity.js";

export const outboxListQuerySchema = z.object({
  status: z.enum(OUTBOX_STATUSES).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200, "pageSize can be at most 200.").default(50),
});
