import { z } from "zod";

/** `npm run landlord:add`: a new landlord and the person who will be its first administrator. */
export const landlordInputSchema = z.object({
  name: z
    .string({ error: "Give the landlord's name (--name)." })
    .trim()
    .min(1, "Give the landlord's name (--name).")
    .max(190, "A landlord's name can be at most 190 characters."),
  adminEmail: z
    .string({ error: "Give the first administrator's e-mail address (--admin-email)." })
    .trim()
    .toLowerCase()
    .max(190, "An e-mail address can be at most 190 characters.")
    .pipe(z.email({ error: "Enter a valid e-mail address for the administrator, like name@example.org." })),
  adminName: z
    .string({ error: "Give the first administrator's name (--admin-name)." })
    .trim()
    .min(1, "Give the first administrator's name (--admin-name).")
    .max(190, "A name can be at most 190 characters."),
});

export type LandlordInput = z.infer<typeof landlordInputSchema>;
