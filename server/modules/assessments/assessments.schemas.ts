import { z } from "zod";

export const assessmentSchema = z.object({
  likelihood: z.number({ error: 'likelihood must be a number: the L in "1 in L".' }),
  spread: z.tuple([z.number(), z.number(), z.number(), z.number()], {
    error: "spread must be four percentages for classes I–IV.",
  }),
  justification: z
    .string({ error: "Give the reasons for this judgement." })
    .trim()
    .min(10, "Give the reasons for this judgement in a sentence or two.")
    .max(8000),
});
