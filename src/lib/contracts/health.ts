import { z } from "zod";

/** GET /api/health (503 with the same shape when the database does not answer). */
export const healthResponse = z.object({ status: z.enum(["ok", "degraded"]), db: z.enum(["up", "down"]) });
export type HealthResponse = z.infer<typeof healthResponse>;

/** GET /api/health/live: the process is up and serving. */
export const livenessResponse = z.object({ status: z.literal("live") });

/** GET /api/health/ready: 200 when traffic may be sent here; 503 with the reason otherwise. */
export const readinessResponse = z.union([
  z.object({ status: z.literal("ready") }),
  z.object({
    status: z.literal("unready"),
    reason: z.enum(["shutting_down", "database_down", "migrations_pending"]),
    message: z.string(),
    pending: z.array(z.string()).optional(),
  }),
]);
