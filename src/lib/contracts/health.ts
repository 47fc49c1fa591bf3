import { z } from "zod";

/** GET /api/health (503 with the same shape when the database does not answer). */
export const healthResponse = z.object({ status: z.enum(["ok", "degraded"]), db: z.enum(["up", "down"]) });
export type HealthResponse = z.infer<typeof healthResponse>;
