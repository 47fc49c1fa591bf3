// A new API key as an admin asks for it: the schema the server validates with and the admin's form checks with.
import { z } from "zod";
import { API_SCOPES } from "../contracts/integrations.js";

export const apiKeyCreateSchema = z.object({
  name: z
    .string({ error: "Give the key a name, such as the system that will use it." })
    .trim()
    .min(1, "Give the key a name, such as the system that will use it.")
    .max(100, "The name can be at most 100 characters."),
  scopes: z
    .array(z.enum(API_SCOPES, { error: `Each scope must be one of ${API_SCOPES.join(", ")}.` }), {
      error: "Choose what the key may do.",
    })
    .min(1, "Choose at least one thing the key may do.")
    .transform((s) => [...new Set(s)]),
});
export type ApiKeyCreateInput = z.infer<typeof apiKeyCreateSchema>;
