// The conversation on a case (POST /api/cases/:id/messages and /messages/read), shared by the server
// and the client's compose box, so both check the same rules with the same words.
import { z } from "zod";

export const MESSAGE_MAX_LENGTH = 5000;
/** Photos one message may carry (the same limit as one upload). */
export const MESSAGE_MAX_PHOTOS = 10;

const messageBody = z
  .string({ error: "Write the message." })
  .trim()
  .min(1, "Write the message.")
  .max(MESSAGE_MAX_LENGTH, `Keep the message to ${MESSAGE_MAX_LENGTH.toLocaleString("en-GB")} characters or fewer.`);

/** Staff: a message to the tenant (e-mailed to them) or an internal note only staff see; the choice is made each time. */
export const staffMessageSchema = z.object({
  body: messageBody,
  internal: z.boolean({ error: "internal must be true or false." }),
});
export type StaffMessageInput = z.infer<typeof staffMessageSchema>;

/**
 * A tenant: a message to the landlord, with photos already uploaded to the case (POST /api/cases/:id/photos,
 * the one photo pipeline). A tenant cannot write internal notes, so `internal` is refused rather than ignored.
 */
export const tenantMessageSchema = z.object({
  body: messageBody,
  photoIds: z
    .array(z.number().int().positive(), { error: "photoIds must be a list of photo ids." })
    .max(MESSAGE_MAX_PHOTOS, `Attach at most ${MESSAGE_MAX_PHOTOS} photos to one message.`)
    .default([]),
  internal: z.undefined({ error: "Only staff can write internal notes. Your message goes to your landlord." }).optional(),
});
export type TenantMessageInput = z.infer<typeof tenantMessageSchema>;

/** Marks the conversation read up to a message (the newest one shown), or up to the newest when not given. */
export const markReadSchema = z.object({
  upTo: z.number({ error: "upTo must be the id of a message." }).int().positive().optional(),
});
