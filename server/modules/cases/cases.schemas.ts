import { z } from "zod";

export const worseSchema = z.object({
  note: z.string({ error: "Tell us briefly what has changed." }).trim().min(3, "Tell us briefly what has changed.").max(2000),
});
