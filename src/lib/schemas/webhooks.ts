// A webhook endpoint as an admin registers or edits it: the schema the server validates with and the
// admin's form checks with. Which hosts are allowed is the server's rule (it knows where it runs).
import { z } from "zod";
import { WEBHOOK_EVENT_TYPES } from "../contracts/webhooks.js";

export const webhookUrlSchema = z
  .string({ error: "Enter the address Dewline should send events to." })
  .trim()
  .min(1, "Enter the address Dewline should send events to.")
  .max(2000, "The address can be at most 2000 characters.")
  .refine((v) => URL.canParse(v), "Enter a full address, like https://example.org/dewline-events.");

export const webhookEventTypesSchema = z
  .array(z.enum(WEBHOOK_EVENT_TYPES, { error: "Choose from the listed events." }))
  .min(1, "Choose at least one event.")
  .transform((v) => [...new Set(v)]);

export const webhookEndpointSchema = z.object({
  url: webhookUrlSchema,
  description: z.string().trim().max(200, "The description can be at most 200 characters.").default(""),
  eventTypes: webhookEventTypesSchema,
});
export type WebhookEndpointInput = z.input<typeof webhookEndpointSchema>;

export const webhookEndpointPatchSchema = z
  .object({
    url: webhookUrlSchema.optional(),
    description: z.string().trim().max(200, "The description can be at most 200 characters.").optional(),
    eventTypes: webhookEventTypesSchema.optional(),
    active: z.boolean().optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), "Change at least one thing.");
export type WebhookEndpointPatch = z.infer<typeof webhookEndpointPatchSchema>;
