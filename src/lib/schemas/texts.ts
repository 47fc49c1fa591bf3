// A tenant's text-message choice (PUT /api/me/texts), shared by the server and the tenant's settings
// form. The number's own check (UK mobile) is ukMobileProblem in the domain, with its plain messages.
import { z } from "zod";

export const textChoiceSchema = z.object({
  mobileNumber: z
    .string({ error: "Enter your mobile number, or leave it empty." })
    .max(30, "That number is too long.")
    .nullable(),
  textsOn: z.boolean({ error: "Choose whether you want texts." }),
});
export type TextChoiceInput = z.infer<typeof textChoiceSchema>;
