// The landlord's emergency telephone number (the policy's one text field), shared by the server's
// PUT /api/policy and the admin's policy form so both accept and refuse the same numbers.
import { z } from "zod";

/**
 * A UK telephone number as people write it: 0 and 9 or 10 more digits, or +44 and 9 or 10 digits
 * (with the 0 after +44 in brackets allowed), spaces, hyphens and brackets ignored. The lengths
 * follow the UK numbering plan (Ofcom's National Telephone Numbering Plan: 10-digit national
 * significant numbers, a few 9-digit ones such as some 0800 numbers).
 */
export function isUkPhoneNumber(text: string): boolean {
  const compact = text.replace(/[\s\-()]/g, "").replace(/^\+44\(?0\)?/, "+44");
  return /^0\d{9,10}$/.test(compact) || /^\+44[1-9]\d{8,9}$/.test(compact);
}

export const UK_PHONE_MESSAGE = "Enter a UK telephone number, for example 0300 123 4567 or +44 300 123 4567.";

/** The number as saved: trimmed, inner spacing kept as the admin wrote it; an empty box means none. */
export const emergencyPhoneSchema = z
  .string({ error: "emergencyPhone must be text." })
  .trim()
  .max(32, "emergencyPhone must be at most 32 characters.")
  .transform((s) => (s === "" ? null : s))
  .refine((s) => s === null || isUkPhoneNumber(s), `emergencyPhone: ${UK_PHONE_MESSAGE}`)
  .nullable();

/**
 * PUT /api/policy/heating-support: the landlord's own help for tenants who find heating hard to afford,
 * shown to those tenants beside their home's advice. Shared by the server and the admin's form.
 */
export const heatingSupportSchema = z
  .object({
    supportText: z
      .string({ error: "supportText must be text." })
      .trim()
      .min(1, "Write a few words about the help you offer.")
      .max(1000, "supportText must be at most 1,000 characters."),
    supportPhone: z
      .string({ error: "supportPhone must be text." })
      .trim()
      .max(32, "supportPhone must be at most 32 characters.")
      .transform((s) => (s === "" ? null : s))
      .refine((s) => s === null || isUkPhoneNumber(s), `supportPhone: ${UK_PHONE_MESSAGE}`)
      .nullable()
      .default(null),
    supportLink: z
      .string({ error: "supportLink must be text." })
      .trim()
      .max(500, "supportLink must be at most 500 characters.")
      .transform((s) => (s === "" ? null : s))
      .refine((s) => s === null || /^https:\/\/[^\s]+\.[^\s]+$/.test(s), "supportLink must be a web address starting https://.")
      .nullable()
      .default(null),
  })
  .strict();
export type HeatingSupportInput = z.infer<typeof heatingSupportSchema>;
