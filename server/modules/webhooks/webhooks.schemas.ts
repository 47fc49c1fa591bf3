import { z } from "zod";
import { webhookEndpointSchema } from "../../../src/lib/schemas/webhooks.js";
import { idParam } from "../../lib/validation.js";

export const webhookEndpointCreateSchema = webhookEndpointSchema;
export type WebhookEndpointCreate = z.infer<typeof webhookEndpointCreateSchema>;

export const webhookIdParamsSchema = z.object({ id: idParam("The endpoint id") });
export const webhookDeliveryParamsSchema = webhookIdParamsSchema.extend({ deliveryId: idParam("The delivery id") });

export const webhookDeliveryListQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100, "pageSize can be at most 100.").default(20),
});
